import { toDecimal } from '../materials/e29-rounding';
import type { ProcessMethod } from './process-methods';

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
}

export function windowText(min?: string, max?: string, unit = ''): string {
  const suffix = unit ? ` ${unit}` : '';
  if (min !== undefined && max !== undefined) return `${min}–${max}${suffix}`;
  if (min !== undefined) return `≥ ${min}${suffix}`;
  if (max !== undefined) return `≤ ${max}${suffix}`;
  return 'recorded';
}

/**
 * Checks a run's recorded parameters against its method's window, bounds inclusive and values
 * compared as decimals exactly as recorded (a value outside by any amount is outside). A missing
 * parameter is reported in `missing`, which the caller refuses rather than storing.
 */
export function checkRunWindow(method: ProcessMethod, parameters: Record<string, string>): WindowCheck {
  const items: WindowItem[] = [];
  const missing: string[] = [];
  for (const window of method.parameters) {
    const raw = parameters[window.key]?.trim();
    if (!raw) {
      missing.push(window.key);
      continue;
    }
    if (window.text) {
      items.push({ key: window.key, label: window.label, value: raw, window: 'recorded', verdict: 'recorded', why: null });
      continue;
    }
    const value = toDecimal(raw);
    const text = windowText(window.min, window.max, window.unit);
    let why: string | null = null;
    if (window.min !== undefined && value.lessThan(window.min)) why = `${raw} ${window.unit} is below the minimum ${window.min} ${window.unit}`;
    if (window.max !== undefined && value.greaterThan(window.max)) why = `${raw} ${window.unit} is above the maximum ${window.max} ${window.unit}`;
    items.push({ key: window.key, label: window.label, value: raw, window: text, verdict: why ? 'out-of-window' : 'in-window', why });
  }
  return { inWindow: missing.length === 0 && items.every((item) => item.verdict !== 'out-of-window'), items, missing };
}
