// The assessment of a recall drill: how long the scope took, and whether the scope can be trusted
// (every shipped unit accounted for, every lot's genealogy complete, nothing left outside the
// scope that should be in it). Pure: the facts come in, the verdicts go out.

export interface DrillLotFacts {
  lotNumber: string;
  status: string;
  origin: string;
  parents: string[];
  made: number | null;
  /** Units moved out of this lot into lots split or merged from it. */
  passedOn: number;
  released: number;
  /** As the latest snapshot traced it. */
  shipped: number;
  onHand: number;
  /** Units in shipment records of the lot now, counted apart from the snapshot. */
  shippedNow: number;
  /** The heats the lot is made of, with their disposition and how many certificates they carry. */
  sourceHeats: Array<{ heatNumber: string; status: string; certificates: number }>;
  /** Lots split or merged from this one that the scope does not hold. */
  childrenOutsideScope: string[];
}

export interface DrillFacts {
  openedAt: string;
  closedAt: string | null;
  /** When the report is made (for a drill still open). */
  asOf: string;
  openingTakenAt: string;
  /** How long the opening trace took to compute, when the snapshot recorded it. */
  tracedInMs: number | null;
  reruns: number;
  lotsAddedSinceOpening: string[];
  lotsRemovedSinceOpening: string[];
  lots: DrillLotFacts[];
  consignees: Array<{ name: string; units: number }>;
}

export type DrillCheckId = 'shipped-units' | 'unit-balance' | 'genealogy' | 'scope-closed' | 'scope-current';

export interface DrillCheck {
  id: DrillCheckId;
  label: string;
  passed: boolean;
  detail: string;
  offenders: string[];
}

export interface DrillAssessment {
  timing: {
    /** Opening to the first frozen scope. */
    toFirstScopeMs: number;
    tracedInMs: number | null;
    /** Opening to the closing signature that confirms the scope; null while the drill is open. */
    toConfirmedScopeMs: number | null;
    /** Opening to now, for a drill still open. */
    elapsedMs: number;
    reruns: number;
    scopeChanged: boolean;
  };
  totals: { lots: number; made: number; released: number; shipped: number; onHand: number; consignees: number };
  checks: DrillCheck[];
  /** Every check passed. */
  complete: boolean;
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

function check(
  id: DrillCheckId,
  label: string,
  offenders: string[],
  passText: string,
  failText: (n: number) => string,
): DrillCheck {
  return {
    id,
    label,
    passed: offenders.length === 0,
    detail: offenders.length ? failText(offenders.length) : passText,
    offenders,
  };
}

const millis = (iso: string) => {
  const time = Date.parse(iso);
  if (Number.isNaN(time)) throw new Error(`"${iso}" is not a time`);
  return time;
};

export function assessDrill(facts: DrillFacts): DrillAssessment {
  const opened = millis(facts.openedAt);
  const shippedTotal = facts.lots.reduce((sum, lot) => sum + lot.shipped, 0);
  const consigneeUnits = facts.consignees.reduce((sum, consignee) => sum + consignee.units, 0);

  const overShipped = facts.lots
    .filter((lot) => lot.shipped > lot.released)
    .map((lot) => `${lot.lotNumber}: shipped ${lot.shipped} of ${lot.released} released`);
  const unassigned =
    consigneeUnits === shippedTotal
      ? []
      : [`consignees received ${consigneeUnits} units; the lots shipped ${shippedTotal}`];
  const kept = (lot: DrillLotFacts) => (lot.made ?? 0) - lot.passedOn;
  const overReleased = facts.lots
    .filter((lot) => lot.made !== null && (lot.released > kept(lot) || kept(lot) < 0))
    .map(
      (lot) =>
        `${lot.lotNumber}: released ${lot.released} of ${lot.made} ` +
        `started${lot.passedOn ? ` less ${lot.passedOn} passed on` : ''}`,
    );
  // In plant: a released lot's released units not shipped; a lot not yet released holds its work in progress (never
  // below 0).
  const negative = facts.lots
    .filter((lot) => lot.onHand < 0 || (lot.status === 'released' && lot.onHand !== lot.released - lot.shipped))
    .map((lot) =>
      lot.onHand < 0
        ? `${lot.lotNumber}: ${lot.onHand} in plant`
        : `${lot.lotNumber}: ${lot.onHand} in plant ≠ ${lot.released} released − ${lot.shipped} shipped`,
    );

  const genealogy: string[] = [];
  for (const lot of facts.lots) {
    if (!lot.sourceHeats.length) genealogy.push(`${lot.lotNumber}: no heat of bar recorded`);
    for (const heat of lot.sourceHeats) {
      if (heat.status !== 'accepted')
        genealogy.push(`${lot.lotNumber}: heat ${heat.heatNumber} is ${heat.status}, not accepted`);
      if (heat.certificates === 0) genealogy.push(`${lot.lotNumber}: heat ${heat.heatNumber} has no certificate`);
    }
    if ((lot.origin === 'split' || lot.origin === 'merge') && !lot.parents.length)
      genealogy.push(`${lot.lotNumber}: ${lot.origin} lot with no parent lot`);
  }
  const outside = facts.lots.flatMap((lot) =>
    lot.childrenOutsideScope.map((child) => `${child} (from ${lot.lotNumber})`),
  );
  const stale = facts.lots
    .filter((lot) => lot.shippedNow !== lot.shipped)
    .map((lot) => `${lot.lotNumber}: ${lot.shipped} shipped when traced, ${lot.shippedNow} now`);

  const checks: DrillCheck[] = [
    check(
      'shipped-units',
      'Every shipped unit is accounted for',
      [...overShipped, ...unassigned],
      `${plural(shippedTotal, 'unit')} shipped, all to named consignees; no lot shipped more than it released`,
      (n) => `${plural(n, 'discrepancy', 'discrepancies')} between units shipped, released and received`,
    ),
    check(
      'unit-balance',
      'Units made, released, shipped and on hand balance',
      [...overReleased, ...negative],
      'No lot released more than it kept of what it started; released = shipped + on hand for every lot',
      (n) => `${plural(n, 'lot')} out of balance`,
    ),
    check(
      'genealogy',
      'Every lot’s genealogy is complete',
      genealogy,
      'Every lot goes back to accepted heats with certificates; every split or merged lot names its parents',
      (n) => `${plural(n, 'gap')} in the genealogy`,
    ),
    check(
      'scope-closed',
      'Nothing is left outside the scope',
      outside,
      'Every lot split or merged from an affected lot is in the scope',
      (n) => `${plural(n, 'lot')} made from affected lots but missing from the scope`,
    ),
    check(
      'scope-current',
      'The scope is current',
      stale,
      'Shipments recorded now match the traced scope',
      (n) => `${plural(n, 'lot')} shipped since the scope was traced; re-run the trace`,
    ),
  ];

  return {
    timing: {
      toFirstScopeMs: millis(facts.openingTakenAt) - opened,
      tracedInMs: facts.tracedInMs,
      toConfirmedScopeMs: facts.closedAt ? millis(facts.closedAt) - opened : null,
      elapsedMs: (facts.closedAt ? millis(facts.closedAt) : millis(facts.asOf)) - opened,
      reruns: facts.reruns,
      scopeChanged: facts.lotsAddedSinceOpening.length + facts.lotsRemovedSinceOpening.length > 0,
    },
    totals: {
      lots: facts.lots.length,
      // Units passed on to split or merged lots are counted in those lots, not twice.
      made: facts.lots.reduce((sum, lot) => sum + Math.max(0, kept(lot)), 0),
      released: facts.lots.reduce((sum, lot) => sum + lot.released, 0),
      shipped: shippedTotal,
      onHand: facts.lots.reduce((sum, lot) => sum + lot.onHand, 0),
      consignees: facts.consignees.length,
    },
    checks,
    complete: checks.every((entry) => entry.passed),
  };
}

/** "2 h 05 min", "3 min 20 s", "850 ms": a duration as a person reads it. */
export function durationText(ms: number): string {
  if (ms < 1000) return `${Math.round(ms)} ms`;
  const seconds = Math.round(ms / 1000);
  if (seconds < 60) return `${seconds} s`;
  const minutes = Math.floor(seconds / 60);
  if (minutes < 60) return `${minutes} min ${String(seconds % 60).padStart(2, '0')} s`;
  const hours = Math.floor(minutes / 60);
  if (hours < 48) return `${hours} h ${String(minutes % 60).padStart(2, '0')} min`;
  return `${Math.floor(hours / 24)} d ${hours % 24} h`;
}
