import { KittingInputError } from './errors.ts';

const KIT_CODE = /^KIT-(\d{4})(\d{2})(\d{2})-(\d{4})$/;
const MAX_SEQUENCE = 9999;

/**
 * Our kit code: "KIT-" + issue day YYYYMMDD (UTC) + "-" + four-digit sequence of that day, e.g.
 * KIT-20261201-0003. Fixed width like the lot and container codes, so codes sort in issue order
 * and a Code 128 of it stays short; the caller passes the clock and the next free sequence.
 * @throws KittingInputError (field `sequence` or `date`).
 */
export function makeKitCode(date: Date, sequence: number): string {
  if (!Number.isInteger(sequence) || sequence < 1 || sequence > MAX_SEQUENCE) {
    throw new KittingInputError('sequence', `sequence must be a whole number from 1 to ${MAX_SEQUENCE}`);
  }
  if (!(date instanceof Date) || Number.isNaN(date.getTime())) throw new KittingInputError('date', 'date is not a valid date');
  const y = date.getUTCFullYear();
  if (y < 1000 || y > 9999) throw new KittingInputError('date', 'the year must have four digits');
  const pad = (v: number, w: number) => String(v).padStart(w, '0');
  return `KIT-${y}${pad(date.getUTCMonth() + 1, 2)}${pad(date.getUTCDate(), 2)}-${pad(sequence, 4)}`;
}

/** A kit code read back in canonical upper case (surrounding space ignored), or null. */
export function parseKitCode(text: string): string | null {
  const code = text.trim().toUpperCase();
  const m = KIT_CODE.exec(code);
  if (!m) return null;
  const [, y, mo, d, seq] = m;
  const check = new Date(Date.UTC(Number(y), Number(mo) - 1, Number(d)));
  if (check.getUTCFullYear() !== Number(y) || check.getUTCMonth() !== Number(mo) - 1 || check.getUTCDate() !== Number(d)) return null;
  if (Number(seq) < 1) return null;
  return code;
}
