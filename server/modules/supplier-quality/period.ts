import type { ScorecardPeriod } from '../../../shared/api/supplier-quality.ts';
import { AppError } from '../../http/app-error.ts';

const DAY = /^\d{4}-\d{2}-\d{2}$/;
const isDay = (v: string) => DAY.test(v) && new Date(`${v}T00:00:00Z`).toISOString().slice(0, 10) === v;

/**
 * Reads `from` and `to` (YYYY-MM-DD, both inclusive, UTC days) from a query string. Defaults:
 * `to` today, `from` one year before `to`. At most ten years.
 */
export function parsePeriod(query: Record<string, unknown>, now = new Date()): ScorecardPeriod {
  const errors = [];
  const read = (field: 'from' | 'to') => {
    const v = query[field];
    if (v === undefined || v === '') return undefined;
    if (typeof v !== 'string' || !isDay(v)) {
      errors.push({ field, message: `${field} must be a date YYYY-MM-DD` });
      return undefined;
    }
    return v;
  };
  const to = read('to') ?? now.toISOString().slice(0, 10);
  let from = read('from');
  if (!from) {
    const d = new Date(`${to}T00:00:00Z`);
    d.setUTCFullYear(d.getUTCFullYear() - 1);
    from = d.toISOString().slice(0, 10);
  }
  if (!errors.length && from > to) errors.push({ field: 'from', message: 'from must not lie after to' });
  if (!errors.length && Date.parse(to) - Date.parse(from) > 10 * 366 * 86_400_000) errors.push({ field: 'from', message: 'the period may span at most ten years' });
  if (errors.length) throw AppError.badRequest(`Check ${errors.map((e) => e.field).join(', ')}.`, errors);
  return { from, to };
}
