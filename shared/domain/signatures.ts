import { canonicalJson } from './ledger-hash';
import { plantDateTimeSeconds, timeZoneAbbreviation } from './plant-time';

/** What a signature means; each record type allows some of these. */
export const signatureMeanings = [
  'reviewed',
  'approved',
  'approved-for-release',
  'rejected',
  'accepted',
  'quarantined',
  'dispositioned',
  'closed',
  'withdrawn',
  'lifted',
  'justified',
  'confirmed',
  'returned-to-engineering',
  'refused',
  'issued',
  'closed-justified',
] as const;
export type SignatureMeaning = (typeof signatureMeanings)[number];

export const meaningLabels: Record<SignatureMeaning, string> = {
  reviewed: 'Reviewed',
  approved: 'Approved',
  'approved-for-release': 'Approved for release',
  rejected: 'Rejected',
  accepted: 'Accepted',
  quarantined: 'Quarantined',
  dispositioned: 'Disposition decided',
  closed: 'Closed',
  withdrawn: 'Signature withdrawn',
  lifted: 'Hold lifted',
  justified: 'Justified for acceptance',
  confirmed: 'Role change confirmed',
  'returned-to-engineering': 'Returned to engineering',
  refused: 'Role change refused',
  issued: 'Notices issued',
  'closed-justified': 'Closed below the effectiveness level, with justification',
};

/** Meanings that must carry a reason. */
export const meaningsNeedingReason: readonly SignatureMeaning[] = [
  'rejected',
  'quarantined',
  'closed',
  'withdrawn',
  'lifted',
  'justified',
  'returned-to-engineering',
  'refused',
  'closed-justified',
];

/** The statement shown beside every signature (21 CFR 11.100(c) / 11.50 manifestation). */
export const signatureStatement =
  'By signing, I confirm that this electronic signature is the legally binding equivalent of my handwritten ' +
  'signature, that I have reviewed the content shown, and that the meaning stated is what I intend.';

export type Sha256 = (text: string) => string;

/** SHA-256 (hex) of the RFC 8785 canonical JSON of a record's content. */
export function contentHash(content: unknown, sha256: Sha256): string {
  return sha256(canonicalJson(content));
}

/** What a re-authentication is bound to: this record, this meaning, this exact content. */
export function signatureBinding(
  input: { recordType: string; recordId: string; meaning: SignatureMeaning; contentHash: string },
  sha256: Sha256,
): string {
  return sha256(
    canonicalJson({
      recordType: input.recordType,
      recordId: input.recordId,
      meaning: input.meaning,
      contentHash: input.contentHash,
    }),
  );
}

/** The signature's manifestation: printed name, date and time with zone, and meaning. */
export function signatureManifestation(input: {
  signerName: string;
  signedAt: Date;
  meaning: SignatureMeaning;
  timeZone?: string;
}): string {
  const timeZone = input.timeZone ?? 'UTC';
  const stamp = `${plantDateTimeSeconds(input.signedAt, timeZone)} ${timeZoneAbbreviation(input.signedAt, timeZone)}`;
  return `${input.signerName} — ${meaningLabels[input.meaning]} — ${stamp}`;
}
