import { parseOwnCode } from '../labels/index.ts';
import { KittingInputError } from './errors.ts';

/** One part of a kit on the pick list. */
export interface PickPart {
  containerCode: string;
  position: number;
  /** Storage location of the container (as Bins keeps it). */
  location: string;
  /** ISO time of the pull, or null while the part is still in its container. */
  pulledAt: string | null;
}

const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

/**
 * Pick-list order: by storage location ("Rack 2" before "Rack 10": numbers inside the text
 * compare as numbers, case ignored), then container code, then position — one walk past each
 * location, each container opened once, positions in order.
 */
export function comparePick(a: Pick<PickPart, 'location' | 'containerCode' | 'position'>, b: Pick<PickPart, 'location' | 'containerCode' | 'position'>): number {
  return collator.compare(a.location, b.location) || collator.compare(a.containerCode, b.containerCode) || a.position - b.position;
}

/** A copy of the parts in pick-list order (comparePick). */
export function orderPickList<T extends Pick<PickPart, 'location' | 'containerCode' | 'position'>>(parts: readonly T[]): T[] {
  return [...parts].sort(comparePick);
}

/** The first part in pick order not yet pulled, or null when the kit is complete. */
export function nextToPull<T extends PickPart>(parts: readonly T[]): T | null {
  return orderPickList(parts).find((p) => p.pulledAt === null) ?? null;
}

/** Pull progress, e.g. { pulled: 7, total: 12, text: "7 of 12 pulled" }. */
export function pullProgress(parts: readonly Pick<PickPart, 'pulledAt'>[]): { pulled: number; total: number; complete: boolean; text: string } {
  const pulled = parts.filter((p) => p.pulledAt !== null).length;
  return { pulled, total: parts.length, complete: parts.length > 0 && pulled === parts.length, text: `${pulled} of ${parts.length} pulled` };
}

/** What a pick scan names: a container and, when the scan carried it, a position. */
export interface PickScan {
  /** Canonical container code (upper case). */
  containerCode: string;
  position: number | null;
}

/**
 * Reads a scan or typed text at the pick list: a container code alone ("C-20261201-0012" or
 * "C-20261201-10000", any case) or followed by a position after a space, "/", ".", ":" or "#", optionally written
 * "P7" or "pos 7" — "C-20261201-0012/7", "c-20261201-0012 pos 7". Null when the text does not
 * start with one of our container codes.
 */
export function readPickScan(text: string): PickScan | null {
  // 4–6 digits after the date (own-codes.ts); parseOwnCode below refuses a wide form with a leading 0.
  const m = /^\s*(C-\d{8}-\d{4,6})(?:\s*[\s/.:#]\s*(?:P(?:OS(?:ITION)?)?\s*)?(\d{1,6}))?\s*$/i.exec(text);
  if (!m) return null;
  const own = parseOwnCode(m[1] as string);
  if (!own || own.kind !== 'container') return null;
  const position = m[2] === undefined ? null : Number(m[2]);
  if (position !== null && position < 1) return null;
  return { containerCode: own.code, position };
}

export type PullCheck<T> =
  | { ok: true; part: T }
  | { ok: false; reason: 'wrong-container' | 'wrong-position' | 'already-pulled'; field: 'containerCode' | 'position'; message: string; part: T | null };

/**
 * Checks a scanned container and position against a kit's parts before a pull: the container
 * must hold a part of the kit, the position must be one of the kit's places in it, and that
 * part must not be pulled yet. Refusals say what was scanned and what the kit needs instead.
 * @throws KittingInputError (field `position`) for a position that is not a whole number ≥ 1.
 */
export function checkPull<T extends PickPart>(parts: readonly T[], containerCode: string, position: number): PullCheck<T> {
  if (!Number.isInteger(position) || position < 1) throw new KittingInputError('position', 'position must be a whole number ≥ 1');
  const code = containerCode.trim().toUpperCase();
  const inContainer = orderPickList(parts.filter((p) => p.containerCode.toUpperCase() === code));
  if (inContainer.length === 0) {
    const next = nextToPull(parts);
    const hint = next ? ` Next to pull: ${next.containerCode} position ${next.position} (${next.location}).` : ' Every part of this kit is pulled already.';
    return { ok: false, reason: 'wrong-container', field: 'containerCode', part: null, message: `Wrong container: ${code} holds no part of this kit.${hint}` };
  }
  const part = inContainer.find((p) => p.position === position);
  if (!part) {
    const open = inContainer.filter((p) => p.pulledAt === null).map((p) => p.position);
    const hint = open.length
      ? ` From ${code} this kit needs position${open.length > 1 ? 's' : ''} ${open.join(', ')}.`
      : ` Every part of this kit in ${code} is pulled already.`;
    return { ok: false, reason: 'wrong-position', field: 'position', part: null, message: `Wrong position: position ${position} of ${code} is not part of this kit.${hint}` };
  }
  if (part.pulledAt !== null) {
    return { ok: false, reason: 'already-pulled', field: 'position', part, message: `Already pulled: position ${position} of ${code} was pulled for this kit at ${part.pulledAt}.` };
  }
  return { ok: true, part };
}
