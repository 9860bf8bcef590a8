import { toDecimal } from '../materials/e29-rounding';
import { contactCategoryLabels, type ContactCategory } from './contact-categories';
import type { ParameterWindow, ProcessMethod } from './process-methods';

export interface WindowItem {
  key: string;
  label: string;
  value: string;
  window: string;
  verdict: 'in-window' | 'out-of-window' | 'recorded';
  why: string | null;
}

export interface WindowCheck {
  inWindow: boolean;
  items: WindowItem[];
  missing: string[];
  /** For methods with temperature/time pairings: the pairing the run meets, or null when none holds. */
  pairing?: string | null;
}

export function windowText(min?: string, max?: string, unit = ''): string {
  const suffix = unit ? ` ${unit}` : '';
  if (min !== undefined && max !== undefined) return `${min}–${max}${suffix}`;
  if (min !== undefined) return `≥ ${min}${suffix}`;
  if (max !== undefined) return `≤ ${max}${suffix}`;
  return 'recorded';
}

/**
 * The window that applies to a run's devices: a limit set per contact category (endotoxin) takes
 * the strictest among the categories of the lots in the run. Without categories (no lot known yet)
 * it is the strictest of all, so nothing is judged against a looser limit than it may need.
 */
export function windowForRun(
  window: ParameterWindow,
  categories: readonly ContactCategory[] = [],
): ParameterWindow & { appliesTo?: ContactCategory } {
  if (!window.byContactCategory?.length) return window;
  const candidates = categories.length
    ? window.byContactCategory.filter((limit) => categories.includes(limit.category))
    : window.byContactCategory;
  const pool = candidates.length ? candidates : window.byContactCategory;
  const strictest = pool.reduce((lowest, limit) => (toDecimal(limit.max).lessThan(lowest.max) ? limit : lowest));
  return { ...window, max: strictest.max, source: strictest.source, appliesTo: strictest.category };
}

/**
 * Checks a run's recorded parameters against its method's window, bounds inclusive and values
 * compared as decimals exactly as recorded (a value outside by any amount is outside). A missing
 * parameter is reported in `missing`, which the caller refuses rather than storing. `categories`
 * are the contact categories of the devices in the run.
 */
export function checkRunWindow(
  method: Pick<ProcessMethod, 'parameters' | 'pairings'>,
  parameters: Record<string, string>,
  categories: readonly ContactCategory[] = [],
): WindowCheck {
  const items: WindowItem[] = [];
  const missing: string[] = [];
  for (const declared of method.parameters) {
    const window = windowForRun(declared, categories);
    const raw = parameters[window.key]?.trim();
    if (!raw) {
      missing.push(window.key);
      continue;
    }
    if (window.text) {
      items.push({
        key: window.key,
        label: window.label,
        value: raw,
        window: 'recorded',
        verdict: 'recorded',
        why: null,
      });
      continue;
    }
    const value = toDecimal(raw);
    const text =
      windowText(window.min, window.max, window.unit) +
      (window.appliesTo ? ` (${contactCategoryLabels[window.appliesTo].toLowerCase()} contact)` : '');
    let why: string | null = null;
    if (window.min !== undefined && value.lessThan(window.min))
      why = `${raw} ${window.unit} is below the minimum ${window.min} ${window.unit}`;
    if (window.max !== undefined && value.greaterThan(window.max))
      why = `${raw} ${window.unit} is above the maximum ${window.max} ${window.unit}`;
    items.push({
      key: window.key,
      label: window.label,
      value: raw,
      window: text,
      verdict: why ? 'out-of-window' : 'in-window',
      why,
    });
  }
  const pairing = method.pairings ? checkPairings(method, items) : undefined;
  return {
    inWindow: missing.length === 0 && items.every((item) => item.verdict !== 'out-of-window'),
    items,
    missing,
    ...(pairing !== undefined ? { pairing } : {}),
  };
}

/**
 * A run is in window only if its temperature and time meet one pairing together: a citric bath
 * at 25 °C for 5 minutes meets neither Citric 1 (hot, short) nor Citric 3 (cool, long).
 */
function checkPairings(method: Pick<ProcessMethod, 'pairings'>, items: WindowItem[]): string | null {
  const temperature = items.find((item) => item.key === 'temperature');
  const time = items.find((item) => item.key === 'immersionTime');
  if (!temperature || !time) return null;
  const held = method.pairings!.find(
    (pairing) =>
      !toDecimal(temperature.value).lessThan(pairing.minC) &&
      !toDecimal(temperature.value).greaterThan(pairing.maxC) &&
      !toDecimal(time.value).lessThan(pairing.minMinutes),
  );
  if (held) return held.label;
  const options = method
    .pairings!.map((pairing) => `${pairing.label}: ${pairing.minC}–${pairing.maxC} °C for ≥ ${pairing.minMinutes} min`)
    .join('; ');
  const why =
    `${temperature.value} °C for ${time.value} min meets no temperature and time pairing of the method ` +
    `(${options})`;
  for (const item of [temperature, time]) {
    if (item.verdict === 'out-of-window') continue;
    item.verdict = 'out-of-window';
    item.why = why;
  }
  return null;
}
