import type { Action } from '@shared/auth/permissions';

/** The product's areas, in the order the chain runs from raw material to recall. */
export interface ProductArea {
  /** The action a person's roles must allow to see the area (the server checks its routes too). */
  action: Action;
  name: AreaRouteName;
  path: string;
  title: string;
  icon: string;
  /** What the area holds, shown on its page and on the overview. */
  summary: string;
  /** What a person will be able to do here once the area is built. */
  plannedWork: string[];
  /** Areas where a release decision is prepared or shown carry the regulated-release caution. */
  releaseRelated: boolean;
}

export type AreaRouteName =
  'heats' | 'bar-stock' | 'lots' | 'process-runs' | 'release' | 'trace' | 'audit' | 'administration';

export const productAreas: ProductArea[] = [
  {
    name: 'heats',
    action: 'materials.read',
    path: '/heats',
    title: 'Heats and certificates',
    icon: 'pi pi-file-check',
    summary:
      'Heats of bar received from the mills, their certificates and the evaluation of every reported result ' +
      'against the specification.',
    plannedWork: [
      'Receive a heat against a supplier and a specification revision',
      'Upload the mill certificate and enter or import its results',
      'See each element and mechanical property evaluated with ASTM E29 rounding',
      'Accept, quarantine or reject the heat with an electronic signature',
    ],
    releaseRelated: false,
  },
  {
    name: 'bar-stock',
    action: 'materials.read',
    path: '/bar-stock',
    title: 'Bar stock',
    icon: 'pi pi-minus',
    summary: 'Every bar piece with its tag, heat, length and location; cuts make child pieces with their own tags.',
    plannedWork: [
      'Receive bar pieces against an accepted heat',
      'Cut a piece and print its tag with a QR code',
      'See what length remains on each piece',
    ],
    releaseRelated: false,
  },
  {
    name: 'lots',
    action: 'lots.read',
    path: '/lots',
    title: 'Production lots',
    icon: 'pi pi-box',
    summary:
      'Production lots with the bar issued to them, the operations recorded along their routing, splits, ' +
      'merges and shipments.',
    plannedWork: [
      'Open a lot and issue bar to it',
      'Record operations, inspections and nonconformances',
      'Reconcile bar length and unit counts',
    ],
    releaseRelated: true,
  },
  {
    name: 'process-runs',
    action: 'lots.read',
    path: '/process-runs',
    title: 'Process runs',
    icon: 'pi pi-sync',
    summary:
      'Passivation and cleaning runs, each holding many lots, with their parameters checked against the ' +
      'method’s window.',
    plannedWork: [
      'Group lots into a passivation or cleaning run',
      'Record bath, concentration, temperature and time',
      'Raise a nonconformance automatically when a run leaves its window',
    ],
    releaseRelated: false,
  },
  {
    name: 'release',
    action: 'release.read',
    path: '/release',
    title: 'Release desk',
    icon: 'pi pi-verified',
    summary:
      'Lots awaiting review and approval, their readiness checklist, the signatures and the release packet ' +
      'with its UDI.',
    plannedWork: [
      'See why a lot is or is not ready',
      'Review and approve with two electronic signatures',
      'Download the release packet and the lot label',
    ],
    releaseRelated: true,
  },
  {
    name: 'trace',
    action: 'trace.read',
    path: '/trace',
    title: 'Trace and recall',
    icon: 'pi pi-sitemap',
    summary: 'Where a unit came from, and which lots and consignees a suspect heat, bar or run reaches.',
    plannedWork: [
      'Trace back from a UDI, a lot or a bar tag',
      'Trace forward from a heat, bar, run or supplier',
      'Open a recall investigation, place holds and notify',
    ],
    releaseRelated: false,
  },
  {
    name: 'audit',
    action: 'audit.read',
    path: '/audit',
    title: 'Audit trail',
    icon: 'pi pi-history',
    summary: 'The append-only, hash-chained record of every change, signature and sign-in.',
    plannedWork: [
      'Filter the audit trail by person, action, record and time',
      'Verify the hash chain',
      'Export a self-verifying bundle',
    ],
    releaseRelated: false,
  },
  {
    name: 'administration',
    action: 'people.read',
    path: '/administration',
    title: 'Administration',
    icon: 'pi pi-cog',
    summary: 'People, their roles and the configuration of this site.',
    plannedWork: ['See who has signed in and in which roles', 'Adjust role membership', 'Deactivate a person'],
    releaseRelated: false,
  },
];

export function findArea(name: string): ProductArea | undefined {
  return productAreas.find((area) => area.name === name);
}
