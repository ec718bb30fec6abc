import { LabelFormatError } from './errors.ts';

export type OwnCodeKind = 'lot' | 'container';
export type PlainCodeKind = OwnCodeKind | 'purchaseOrder' | 'unknown';

export interface OwnCode {
  kind: OwnCodeKind;
  /** The code in canonical (upper-case) form. */
  code: string;
  /** Calendar day the code was issued, YYYY-MM-DD. */
  date: string;
  /** Sequence number within that day, 1–999 999. */
  sequence: number;
}

export interface OwnCodeOptions {
  /**
   * Offset of the site's local time from UTC, minutes (e.g. 60 for UTC+1), so the date in the
   * code is the site's calendar day; default 0 (UTC).
   */
  utcOffsetMinutes?: number;
}

export interface ClassifyOptions {
  /** Purchase-order number pattern; default `^PO[-\s]?\d{4,}$`, case-insensitive. */
  purchaseOrderPattern?: RegExp | string;
}

const PREFIX: Readonly<Record<OwnCodeKind, string>> = { lot: 'L', container: 'C' };
const KIND_OF_PREFIX: Readonly<Record<string, OwnCodeKind>> = { L: 'lot', C: 'container' };
// The sequence is written with at least four digits and grows to five or six past 9 999, so
// every code issued before the widening stays valid. A wider form never starts with 0: each
// sequence has exactly one spelling (C-20261201-0012, never C-20261201-00012).
const OWN_CODE = /^([LC])-(\d{4})(\d{2})(\d{2})-(\d{4}|[1-9]\d{4,5})$/;

/** Highest sequence number of a day: six digits (a 100 000-part screening into bags of 10 needs 10 000). */
export const MAX_OWN_CODE_SEQUENCE = 999_999;
/** Digits of the sequence up to 9 999; larger numbers take five or six. */
const MIN_SEQUENCE_DIGITS = 4;
/** How messages describe a container code to the person scanning one. */
export const CONTAINER_CODE_FORMAT = 'C-YYYYMMDD-NNNN, 4–6 digits';

/** Default purchase-order pattern: "PO" then an optional "-" or space and at least four digits. */
export const DEFAULT_PURCHASE_ORDER_PATTERN = /^PO[-\s]?\d{4,}$/i;

/**
 * Our lot code: "L-" + issue date YYYYMMDD + "-" + sequence of at least four digits, e.g.
 * L-20261201-0007; from the 10 000th code of a day the sequence takes five or six digits
 * (L-20261201-10000 … L-20261201-999999). Up to 9 999 a day the width is fixed, so codes sort
 * as plain strings in issue order; past that, sort with `ownCodeSortKey`. Only characters
 * Code 128 and a keyboard handle easily. The caller passes the clock (`date`) and the next free
 * sequence number of that day.
 * @throws LabelFormatError (field `sequence` or `date`) for a sequence outside 1–999 999, an
 * invalid date, or a year outside 1000–9999.
 */
export function makeLotCode(date: Date, sequence: number, options: OwnCodeOptions = {}): string {
  return makeOwnCode('lot', date, sequence, options);
}

/**
 * Our container (bin box) code: "C-" + YYYYMMDD + "-" + sequence of four to six digits, e.g.
 * C-20261201-0012 or C-20261201-10000; same rules as `makeLotCode`.
 * @throws LabelFormatError as `makeLotCode`.
 */
export function makeContainerCode(date: Date, sequence: number, options: OwnCodeOptions = {}): string {
  return makeOwnCode('container', date, sequence, options);
}

/**
 * Reads one of our own lot or container codes back (case-insensitive, surrounding whitespace
 * ignored); null when the text is not such a code or names an impossible date.
 */
export function parseOwnCode(text: string): OwnCode | null {
  const match = OWN_CODE.exec(text.trim().toUpperCase());
  if (!match) return null;
  const [code, prefix, year, month, day, sequence] = match;
  const y = Number(year);
  const m = Number(month);
  const d = Number(day);
  const check = new Date(Date.UTC(y, m - 1, d));
  if (check.getUTCFullYear() !== y || check.getUTCMonth() !== m - 1 || check.getUTCDate() !== d) return null;
  const seq = Number(sequence);
  if (seq < 1) return null;
  return { kind: KIND_OF_PREFIX[prefix], code, date: `${year}-${month}-${day}`, sequence: seq };
}

/**
 * A key that sorts our codes in issue order as plain strings whatever the sequence width
 * ("C-20261201-9999" before "C-20261201-10000"): the sequence padded to six digits. Text that
 * is not one of our codes is returned trimmed and upper-cased, unchanged otherwise.
 */
export function ownCodeSortKey(code: string): string {
  const own = parseOwnCode(code);
  if (!own) return code.trim().toUpperCase();
  return `${own.code.slice(0, 11)}${pad(own.sequence, 6)}`;
}

/**
 * What a plain (non-ISO/IEC 15434) scanned code is: one of our lot or container codes, a
 * purchase-order number matching the site's pattern, or unknown.
 * @throws LabelFormatError (field `purchaseOrderPattern`) when a pattern string is not a valid
 * regular expression.
 */
export function classifyPlainCode(text: string, options: ClassifyOptions = {}): PlainCodeKind {
  const own = parseOwnCode(text);
  if (own) return own.kind;
  if (purchaseOrderRegExp(options.purchaseOrderPattern).test(text.trim())) return 'purchaseOrder';
  return 'unknown';
}

function purchaseOrderRegExp(pattern: RegExp | string | undefined): RegExp {
  if (pattern === undefined) return DEFAULT_PURCHASE_ORDER_PATTERN;
  try {
    // A fresh object without g/y, so test() keeps no lastIndex between calls.
    return typeof pattern === 'string'
      ? new RegExp(pattern, 'i')
      : new RegExp(pattern.source, pattern.flags.replace(/[gy]/g, ''));
  } catch {
    throw new LabelFormatError(`purchase-order pattern "${String(pattern)}" is not a valid regular expression`, 'purchaseOrderPattern');
  }
}

function makeOwnCode(kind: OwnCodeKind, date: Date, sequence: number, options: OwnCodeOptions): string {
  if (!Number.isInteger(sequence) || sequence < 1 || sequence > MAX_OWN_CODE_SEQUENCE) {
    throw new LabelFormatError(`sequence must be a whole number from 1 to ${MAX_OWN_CODE_SEQUENCE}`, 'sequence');
  }
  const offset = options.utcOffsetMinutes ?? 0;
  if (!Number.isFinite(offset)) throw new LabelFormatError('utcOffsetMinutes must be a finite number', 'utcOffsetMinutes');
  if (!(date instanceof Date) || Number.isNaN(date.getTime())) {
    throw new LabelFormatError('date is not a valid date', 'date');
  }
  const local = new Date(date.getTime() + offset * 60_000);
  const year = local.getUTCFullYear();
  if (year < 1000 || year > 9999) throw new LabelFormatError('the year must have four digits', 'date');
  const ymd = `${year}${pad(local.getUTCMonth() + 1, 2)}${pad(local.getUTCDate(), 2)}`;
  return `${PREFIX[kind]}-${ymd}-${pad(sequence, MIN_SEQUENCE_DIGITS)}`;
}

function pad(value: number, width: number): string {
  return String(value).padStart(width, '0');
}
