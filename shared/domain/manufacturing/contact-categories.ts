/**
 * Where a finished device touches the body decides its bacterial endotoxin limit. The product
 * ships the two limits it can show from a published source; a firm whose devices touch other
 * fluids (intraocular contact has a lower limit per the same guidance) sets its own limit in its
 * validated cleaning method. Verify against the firm's own copy of the guidance and USP <161>.
 */
export const contactCategories = ['general-tissue', 'cerebrospinal-fluid'] as const;
export type ContactCategory = (typeof contactCategories)[number];

export const contactCategoryLabels: Record<ContactCategory, string> = {
  'general-tissue': 'Blood, lymph, bone or other tissue',
  'cerebrospinal-fluid': 'Cerebrospinal fluid',
};

export interface EndotoxinLimit {
  category: ContactCategory;
  /** EU per device, as the source writes it. */
  maxEuPerDevice: string;
  source: string;
}

const fdaGuidance =
  'FDA guidance "Pyrogen and Endotoxins Testing: Questions and Answers" (2012) and USP <161>, as reproduced ' +
  'by Nelson Labs, "Specifications for Endotoxin levels for Medical Devices"';

export const endotoxinLimits: readonly EndotoxinLimit[] = [
  {
    category: 'general-tissue',
    maxEuPerDevice: '20',
    source:
      `${fdaGuidance}: ≤ 20 EU/device (0.5 EU/mL at 40 mL rinse per device) for devices in contact with the ` +
      `cardiovascular and lymphatic systems and devices generally`,
  },
  {
    category: 'cerebrospinal-fluid',
    maxEuPerDevice: '2.15',
    source:
      `${fdaGuidance}: ≤ 2.15 EU/device (0.06 EU/mL at 40 mL rinse per device) for devices in contact with ` +
      `cerebrospinal fluid`,
  },
];
