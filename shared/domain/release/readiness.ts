/**
 * Whether a lot's record allows it to be put forward for release, item by item, each with why
 * and a link to the record concerned. Deterministic: the same record gives the same checklist.
 * The product explains the record; the release decision belongs to the firm's quality system.
 */
export interface ReadinessFacts {
  lot: { id: number; lotNumber: string; onHand: number | null };
  heats: Array<{ id: number; heatNumber: string; status: string }>;
  routing: Array<{ stepNo: number; name: string; kind: string; recordedOn: string | null }>;
  runs: Array<{ id: number; runNumber: string; inWindow: boolean; openNonconformances: number }>;
  inspections: Array<{ stepNo: number; name: string; verdict: 'accept' | 'reject' | null }>;
  unitsConsistent: boolean;
  unitProblems: string[];
  material: Array<{ lotNumber: string; lotId: number; verdict: string; why: string }>;
  openNonconformances: Array<{ id: number; ncNumber: string; status: string }>;
  holds: Array<{ id: number; reference: string }>;
  /** Each bar issued to the lot or its ancestors that an open recall or a nonconformance holds, with why. */
  heldMaterial: Array<{ tag: string; reasons: string[] }>;
  labels: { printed: number; voided: number };
}

export interface ReadinessItem {
  key:
    | 'heats'
    | 'routing'
    | 'runs'
    | 'inspections'
    | 'units'
    | 'material'
    | 'held-material'
    | 'nonconformances'
    | 'holds'
    | 'labels';
  title: string;
  verdict: 'pass' | 'fail';
  why: string;
  link: string | null;
}

export interface Readiness {
  ready: boolean;
  items: ReadinessItem[];
}

const item = (
  key: ReadinessItem['key'],
  title: string,
  failures: string[],
  passWhy: string,
  link: string | null,
): ReadinessItem => ({
  key,
  title,
  verdict: failures.length ? 'fail' : 'pass',
  why: failures.length ? failures.join('; ') : passWhy,
  link,
});

export function releaseReadiness(facts: ReadinessFacts): Readiness {
  const lotLink = `/lots/${facts.lot.id}`;
  const heatFailures = facts.heats
    .filter((heat) => heat.status !== 'accepted')
    .map((heat) => `heat ${heat.heatNumber} is ${heat.status}`);
  if (!facts.heats.length) heatFailures.push('no heat is linked to the lot');
  const missingSteps = facts.routing
    .filter((step) => !step.recordedOn)
    .map((step) => `step ${step.stepNo} ${step.name} is not recorded`);
  const runFailures = facts.runs
    .filter((run) => !run.inWindow && run.openNonconformances > 0)
    .map((run) => `run ${run.runNumber} was outside its window and its nonconformance is not closed`);
  const outsideButClosed = facts.runs
    .filter((run) => !run.inWindow && run.openNonconformances === 0)
    .map((run) => run.runNumber);
  const inspectionFailures = facts.inspections
    .filter((inspection) => inspection.verdict !== 'accept')
    .map((inspection) => `step ${inspection.stepNo} ${inspection.name}: ${inspection.verdict ?? 'not recorded'}`);
  const materialFailures = facts.material
    .filter((entry) => entry.verdict !== 'reconciled')
    .map((entry) => `lot ${entry.lotNumber}: ${entry.why}`);
  const units = facts.lot.onHand ?? 0;
  const labelsNet = facts.labels.printed - facts.labels.voided;
  const labelFailures = labelsNet !== units ? [`${labelsNet} labels printed (net of voided) for ${units} units`] : [];
  const items: ReadinessItem[] = [
    item(
      'heats',
      'Every heat in the genealogy accepted',
      heatFailures,
      `${facts.heats.map((heat) => heat.heatNumber).join(', ')} accepted`,
      facts.heats[0] ? `/heats/${facts.heats[0].id}` : lotLink,
    ),
    item(
      'routing',
      'Every routing step recorded',
      missingSteps,
      `${facts.routing.length} of ${facts.routing.length} steps recorded`,
      lotLink,
    ),
    item(
      'runs',
      'Every process run within its window',
      runFailures,
      facts.runs.length
        ? `${facts.runs.length} run(s) in window` +
            (outsideButClosed.length ? `, except ${outsideButClosed.join(', ')}, whose nonconformances are closed` : '')
        : 'no process runs',
      facts.runs[0] ? `/process-runs/${facts.runs[0].id}` : lotLink,
    ),
    item(
      'inspections',
      'Inspections passed',
      inspectionFailures,
      facts.inspections.length ? `${facts.inspections.length} inspection(s) accepted` : 'the routing has no inspection',
      lotLink,
    ),
    item(
      'units',
      'Unit counts reconciled',
      facts.unitsConsistent ? [] : facts.unitProblems.length ? facts.unitProblems : ['unit counts do not chain'],
      `${units} good units, every step accounted for`,
      lotLink,
    ),
    item(
      'material',
      'Bar length reconciled',
      materialFailures,
      facts.material.map((entry) => `lot ${entry.lotNumber} reconciled`).join(', ') || 'no bar issued',
      lotLink,
    ),
    item(
      'held-material',
      'No bar under a recall or an open nonconformance',
      facts.heldMaterial.flatMap((bar) => bar.reasons.map((reason) => `bar ${bar.tag}: ${reason}`)),
      'no issued bar is held',
      lotLink,
    ),
    item(
      'nonconformances',
      'No open nonconformance',
      facts.openNonconformances.map((nc) => `${nc.ncNumber} is ${nc.status}`),
      'none open',
      facts.openNonconformances[0] ? `/nonconformances/${facts.openNonconformances[0].id}` : lotLink,
    ),
    item(
      'holds',
      'No hold',
      facts.holds.map((hold) => `on hold by ${hold.reference}`),
      'no hold on the lot',
      lotLink,
    ),
    item('labels', 'Labels reconciled', labelFailures, `${labelsNet} labels for ${units} units`, lotLink),
  ];
  return { ready: items.every((entry) => entry.verdict === 'pass'), items };
}
