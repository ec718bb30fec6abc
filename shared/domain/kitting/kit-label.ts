import { dataMatrixCodewords, formatLabel, type LabelElement } from '../labels/index.ts';
import { KittingInputError } from './errors.ts';

/** One part of a kit as the label names it: the container it came from and its position there. */
export interface KitLabelPart {
  containerCode: string;
  position: number;
}

export interface KitLabelInput {
  kitCode: string;
  /** Our part number(s): one for a same-polarity kit, the NPN and the PNP type for a complementary one. */
  partNumbers: readonly string[];
  /** In pick-list order. */
  parts: readonly KitLabelPart[];
}

export interface KitLabelPayload {
  elements: LabelElement[];
  /** The ISO/IEC 15434 format-06 message for the Data Matrix. */
  message: string;
  /** Parts named in DI 11Z; the rest (omittedParts) are only on the pick list. */
  listedParts: number;
  omittedParts: number;
  /** Data codewords the message needs (Macro 06 and digit pairs counted). */
  codewords: number;
}

/**
 * Data codewords allowed for a kit label's Data Matrix: 204 is the 52 × 52 ECC 200 symbol
 * (ISO/IEC 16022 Table 7), which still prints with modules of about 0.6 mm in a 35 mm square.
 */
export const KIT_LABEL_MAX_CODEWORDS = 204;

const CONTAINER_SEPARATOR = ';';
const POSITION_SEPARATOR = ',';

/**
 * The part references of a kit in one line of text for the free-text DI 11Z: per container,
 * "C-YYYYMMDD-NNNN:" (4–6 digits) and its positions ascending, containers in order of first appearance,
 * separated by ";" — e.g. "C-20261201-0012:3,4,7;C-20261201-0013:1". Grouping by container keeps
 * a kit of 40 parts from three containers near 110 codewords.
 * @throws KittingInputError for an empty container code, a code with ":" "," ";" or a position that is not a whole number ≥ 1.
 */
export function kitPartReferences(parts: readonly KitLabelPart[]): string {
  const groups = new Map<string, number[]>();
  parts.forEach((p, i) => {
    const code = p.containerCode.trim();
    if (!code || /[:,;\s]/.test(code)) throw new KittingInputError(`parts[${i}].containerCode`, 'containerCode must be a code without spaces, ":", "," or ";"');
    if (!Number.isInteger(p.position) || p.position < 1) throw new KittingInputError(`parts[${i}].position`, 'position must be a whole number ≥ 1');
    const list = groups.get(code) ?? [];
    list.push(p.position);
    groups.set(code, list);
  });
  return [...groups.entries()].map(([code, ps]) => `${code}:${[...ps].sort((a, b) => a - b).join(POSITION_SEPARATOR)}`).join(CONTAINER_SEPARATOR);
}

/**
 * Reads the text of `kitPartReferences` back into parts (container order kept, positions
 * ascending). A trailing "+N" group (parts left off the label) is returned as `omitted`.
 * @throws KittingInputError (field `text`) for text not in that form.
 */
export function parseKitPartReferences(text: string): { parts: KitLabelPart[]; omitted: number } {
  const parts: KitLabelPart[] = [];
  let omitted = 0;
  for (const group of text.split(CONTAINER_SEPARATOR)) {
    const more = /^\+(\d+)$/.exec(group);
    if (more) {
      omitted = Number(more[1]);
      continue;
    }
    const m = /^([^:,;\s]+):(\d+(?:,\d+)*)$/.exec(group);
    if (!m) throw new KittingInputError('text', `"${group}" is not "container:position,position…"`);
    for (const p of (m[2] as string).split(POSITION_SEPARATOR)) parts.push({ containerCode: m[1] as string, position: Number(p) });
  }
  return { parts, omitted };
}

/**
 * The MH10.8.2 data elements of a kit label's Data Matrix (reference.md §3): T our traceability
 * code (the kit code), P our part number (once per part type), Q the number of parts, and 11Z
 * (free text) the part references of `kitPartReferences`. When the message would need more than
 * `maxCodewords` data codewords, parts are left off the end of 11Z and "+N" says how many — the
 * kit code still leads to the full list.
 * @throws KittingInputError for an empty kit code, no part number or no parts.
 */
export function kitLabelPayload(input: KitLabelInput, maxCodewords = KIT_LABEL_MAX_CODEWORDS): KitLabelPayload {
  const kitCode = input.kitCode.trim();
  if (!kitCode) throw new KittingInputError('kitCode', 'kitCode must not be empty');
  const partNumbers = input.partNumbers.map((p) => p.trim()).filter(Boolean);
  if (partNumbers.length === 0) throw new KittingInputError('partNumbers', 'name at least one part number');
  const n = input.parts.length;
  if (n === 0) throw new KittingInputError('parts', 'a kit label needs at least one part');
  const head: LabelElement[] = [{ di: 'T', value: kitCode }, ...partNumbers.map((p) => ({ di: 'P', value: p })), { di: 'Q', value: String(n) }];
  const build = (k: number): { elements: LabelElement[]; message: string; codewords: number } => {
    const refs = k > 0 ? kitPartReferences(input.parts.slice(0, k)) : '';
    const text = k < n ? (refs ? `${refs}${CONTAINER_SEPARATOR}+${n - k}` : `+${n - k}`) : refs;
    const elements = [...head, { di: '11Z', value: text }];
    const message = formatLabel(elements);
    return { elements, message, codewords: dataMatrixCodewords(message).length };
  };
  const all = build(n);
  if (all.codewords <= maxCodewords) return { ...all, listedParts: n, omittedParts: 0 };
  // The codeword count grows with k: the largest k that fits, by bisection.
  let lo = 0;
  let hi = n - 1;
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2);
    if (build(mid).codewords <= maxCodewords) lo = mid;
    else hi = mid - 1;
  }
  const fitted = build(lo);
  if (fitted.codewords > maxCodewords) throw new KittingInputError('kitCode', `the kit code and part numbers alone need ${fitted.codewords} codewords (at most ${maxCodewords})`);
  return { ...fitted, listedParts: lo, omittedParts: n - lo };
}
