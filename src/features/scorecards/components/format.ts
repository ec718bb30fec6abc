import type { SwitchingSeverityName } from '../../../../shared/api/sampling.ts';

export const pct = (x: number | null, digits = 0) => (x === null ? '—' : `${(x * 100).toFixed(digits)} %`);
export const num = (x: number | null, digits = 1) => (x === null ? '—' : x.toFixed(digits));
export const dppm = (x: number | null) => (x === null ? '—' : Math.round(x).toLocaleString());

export const SEVERITY_TONE: Record<SwitchingSeverityName, 'pass' | 'info' | 'hold' | 'fail'> = {
  reduced: 'pass',
  normal: 'info',
  tightened: 'hold',
  discontinued: 'fail',
};

export const SEVERITY_LABEL: Record<SwitchingSeverityName, string> = {
  reduced: 'Reduced',
  normal: 'Normal',
  tightened: 'Tightened',
  discontinued: 'Discontinued',
};

/** Today and one year back, as YYYY-MM-DD (the server's default period). */
export function defaultPeriod(now = new Date()): { from: string; to: string } {
  const to = now.toISOString().slice(0, 10);
  const d = new Date(`${to}T00:00:00Z`);
  d.setUTCFullYear(d.getUTCFullYear() - 1);
  return { from: d.toISOString().slice(0, 10), to };
}
