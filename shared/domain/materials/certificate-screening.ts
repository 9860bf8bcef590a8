// Screening of a supplier's mill certificates for the marks of copied or adjusted results. Each
// function looks at all heats of one supplier and one specification, and returns findings that
// a QA reviewer must acknowledge (with a reason) before such a heat is accepted. A finding is a
// reason to look, not a verdict.
import { binomialUpperTail } from './distribution';

export interface ScreenedHeat {
  heatId: number;
  heatNumber: string;
  /** When the heat was received (ISO 8601); orders the history. */
  receivedAt: string;
  /** Reported values by property (e.g. "O", "utsMPa"), as the certificate gave them. */
  values: Record<string, string>;
  /** SHA-256 of each certificate document filed for the heat. */
  documentHashes: string[];
}

export interface PropertyLimits {
  min?: string;
  max?: string;
}

export type FindingKind =
  'identical-results' | 'near-identical-results' | 'bunched-at-limit' | 'same-document' | 'precision-change';

export interface CertificateFinding {
  kind: FindingKind;
  /** Stable across screenings of the same history, so that an acknowledgement can refer to it. */
  key: string;
  heatIds: number[];
  property?: string;
  explanation: string;
  statistic?: { name: string; value: number; threshold: number };
}

/** Properties two heats must share before "all but one equal" means anything. */
export const NEAR_IDENTICAL_MIN_SHARED = 5;
/**
 * One-sided significance for bunching; with ~20 properties screened per supplier the chance of a false flag stays near
 * 2 % (Bonferroni).
 */
export const BUNCHING_ALPHA = 0.001;
/** Values inside the near band needed before bunching is judged at all. */
export const BUNCHING_MIN_NEAR = 4;
/** Earlier heats that set a supplier's usual reporting precision. */
export const PRECISION_WINDOW = 5;

export function screenSupplierHistory(
  heats: ScreenedHeat[],
  limits: Record<string, PropertyLimits>,
): CertificateFinding[] {
  const ordered = [...heats].sort((a, b) => a.receivedAt.localeCompare(b.receivedAt) || a.heatId - b.heatId);
  return [
    ...matchingResults(ordered),
    ...bunchingAtLimits(ordered, limits),
    ...sharedDocuments(ordered),
    ...precisionChanges(ordered),
  ];
}

/** Pairs of heats whose results are all equal, or equal in all but one property. */
export function matchingResults(heats: ScreenedHeat[]): CertificateFinding[] {
  const findings: CertificateFinding[] = [];
  for (let i = 0; i < heats.length; i++) {
    for (let j = i + 1; j < heats.length; j++) {
      const a = heats[i]!;
      const b = heats[j]!;
      const shared = Object.keys(a.values).filter((property) => property in b.values);
      if (shared.length < NEAR_IDENTICAL_MIN_SHARED) continue;
      const differing = shared.filter((property) => Number(a.values[property]) !== Number(b.values[property]));
      const pair = `${a.heatNumber} and ${b.heatNumber}`;
      if (differing.length === 0) {
        findings.push({
          kind: 'identical-results',
          key: `identical-results:${a.heatId}:${b.heatId}`,
          heatIds: [a.heatId, b.heatId],
          explanation:
            `Heats ${pair} report the same value for all ${shared.length} properties they share. Two melts ` +
            `rarely agree to the last reported digit; confirm that neither certificate was copied.`,
        });
      } else if (differing.length === 1) {
        const property = differing[0]!;
        findings.push({
          kind: 'near-identical-results',
          key: `near-identical-results:${a.heatId}:${b.heatId}`,
          heatIds: [a.heatId, b.heatId],
          property,
          explanation:
            `Heats ${pair} agree in ${shared.length - 1} of ${shared.length} properties; only ${property} ` +
            `differs (${a.values[property]} and ${b.values[property]}). A certificate copied and edited in one ` +
            `place looks like this.`,
        });
      }
    }
  }
  return findings;
}

/** Decimal places of a reported value as written ("0.20" → 2). */
export function decimalsOf(reported: string): number {
  const text = reported.trim().replace(/^[+-]/, '');
  const fraction = /\.(\d*)$/.exec(text.split(/e/i)[0]!)?.[1];
  return fraction ? fraction.length : 0;
}

function mostCommon(values: number[]): number | null {
  if (!values.length) return null;
  const counts = new Map<number, number>();
  for (const value of values) counts.set(value, (counts.get(value) ?? 0) + 1);
  return [...counts.entries()].sort((a, b) => b[1] - a[1] || a[0] - b[0])[0]![0];
}

/**
 * Values bunched just inside a limit. For each limited property, the supplier's reporting step
 * (its most common number of decimals) divides the values near the limit into bands: the near
 * band (at the limit or one step inside) and the reference band (the next two steps). A
 * process whose usual values lie well inside the limit has a density that does not rise toward
 * the limit, so a value in either band is at most as likely to be in the near band as in the
 * reference band. The count in the near band is tested against Binomial(near + reference, ½),
 * one-sided — a caliper test, as used to detect results heaped just past a threshold (Gerber &
 * Malhotra, 2008). A property is judged only when the rest of its values (beyond the near band)
 * have their median at least four steps inside the limit: closer, the density may rise toward
 * the limit for honest reasons.
 */
export function bunchingAtLimits(heats: ScreenedHeat[], limits: Record<string, PropertyLimits>): CertificateFinding[] {
  const findings: CertificateFinding[] = [];
  for (const [property, limit] of Object.entries(limits)) {
    const reported = heats.filter(
      (heat) => heat.values[property] !== undefined && Number.isFinite(Number(heat.values[property])),
    );
    if (reported.length < BUNCHING_MIN_NEAR * 2) continue;
    const step = 10 ** -(mostCommon(reported.map((heat) => decimalsOf(heat.values[property]!))) ?? 0);
    for (const side of ['max', 'min'] as const) {
      const bound = limit[side];
      if (bound === undefined) continue;
      const distances = reported.map((heat) => {
        const value = Number(heat.values[property]);
        const inside = side === 'max' ? Number(bound) - value : value - Number(bound);
        return { heat, steps: Math.round((inside / step) * 1e6) / 1e6 };
      });
      // Where the rest of the distribution lies: the values beyond the near band.
      const rest = distances
        .map((entry) => entry.steps)
        .filter((steps) => steps > 1)
        .sort((a, b) => a - b);
      if (rest.length < BUNCHING_MIN_NEAR || rest[Math.floor(rest.length / 2)]! < 4) continue;
      const near = distances.filter((entry) => entry.steps >= 0 && entry.steps <= 1);
      const reference = distances.filter((entry) => entry.steps > 1 && entry.steps <= 3);
      if (near.length < BUNCHING_MIN_NEAR) continue;
      const p = binomialUpperTail(near.length, near.length + reference.length, 0.5);
      if (p >= BUNCHING_ALPHA) continue;
      findings.push({
        kind: 'bunched-at-limit',
        key: `bunched-at-limit:${property}:${side}`,
        heatIds: near.map((entry) => entry.heat.heatId),
        property,
        explanation:
          `${near.length} of ${reported.length} heats report ${property} at or one reporting step ` +
          `(${formatStep(step)}) inside the ${side} limit ${bound}, ` +
          (`against ${reference.length} in the next two steps; for a process centred well inside the limit ` +
            `that is unlikely by chance (p = ${p.toExponential(1)}). `) +
          'Values nudged just inside a limit look like this; consider an independent check analysis.',
        statistic: { name: 'caliper test, one-sided binomial p', value: p, threshold: BUNCHING_ALPHA },
      });
    }
  }
  return findings;
}

function formatStep(step: number): string {
  return step >= 1 ? String(step) : step.toFixed(Math.round(-Math.log10(step)));
}

/** One certificate document (by hash) filed for more than one heat. */
export function sharedDocuments(heats: ScreenedHeat[]): CertificateFinding[] {
  const byHash = new Map<string, ScreenedHeat[]>();
  for (const heat of heats)
    for (const hash of new Set(heat.documentHashes)) byHash.set(hash, [...(byHash.get(hash) ?? []), heat]);
  return [...byHash.entries()]
    .filter(([, holders]) => holders.length > 1)
    .map(([hash, holders]) => ({
      kind: 'same-document' as const,
      key: `same-document:${hash}`,
      heatIds: holders.map((heat) => heat.heatId),
      explanation:
        `The same certificate document (SHA-256 ${hash.slice(0, 12)}…) is filed for heats ` +
        `${holders.map((heat) => heat.heatNumber).join(', ')}. Each heat needs its own certificate.`,
    }));
}

/**
 * A heat reported with a different precision from the supplier's usual one: in at least two
 * properties, and in at least half of those compared, its number of decimals differs from the
 * most common one among the previous five heats. A certificate typed up by someone else, or
 * from another laboratory, often shows itself this way.
 */
export function precisionChanges(heats: ScreenedHeat[]): CertificateFinding[] {
  const findings: CertificateFinding[] = [];
  for (let index = PRECISION_WINDOW; index < heats.length; index++) {
    const heat = heats[index]!;
    const earlier = heats.slice(index - PRECISION_WINDOW, index);
    const changed: string[] = [];
    let compared = 0;
    for (const [property, value] of Object.entries(heat.values)) {
      const usual = mostCommon(
        earlier
          .filter((other) => other.values[property] !== undefined)
          .map((other) => decimalsOf(other.values[property]!)),
      );
      if (usual === null || earlier.filter((other) => other.values[property] !== undefined).length < 3) continue;
      compared += 1;
      if (decimalsOf(value) !== usual)
        changed.push(`${property} ${value} (usually ${usual} decimal${usual === 1 ? '' : 's'})`);
    }
    if (changed.length >= 2 && changed.length * 2 >= compared) {
      findings.push({
        kind: 'precision-change',
        key: `precision-change:${heat.heatId}`,
        heatIds: [heat.heatId],
        explanation:
          `Heat ${heat.heatNumber} is reported with a different precision from this supplier's previous ` +
          `${PRECISION_WINDOW} heats: ${changed.join('; ')}. Ask which laboratory issued it.`,
      });
    }
  }
  return findings;
}
