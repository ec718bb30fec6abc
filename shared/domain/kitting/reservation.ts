import { KittingInputError } from './errors.ts';

/** How long a reservation holds parts unless the request says otherwise: 4 h, one work session. */
export const DEFAULT_HOLD_MINUTES = 240;
/** Shortest and longest hold a request may ask for: 15 min to 7 days. */
export const MIN_HOLD_MINUTES = 15;
export const MAX_HOLD_MINUTES = 7 * 24 * 60;

/**
 * When a reservation made at `now` for `holdMinutes` ends.
 * @throws KittingInputError (field `holdMinutes`) outside MIN_HOLD_MINUTES…MAX_HOLD_MINUTES or not whole.
 */
export function reservationEnd(now: Date, holdMinutes = DEFAULT_HOLD_MINUTES): Date {
  if (!Number.isInteger(holdMinutes) || holdMinutes < MIN_HOLD_MINUTES || holdMinutes > MAX_HOLD_MINUTES) {
    throw new KittingInputError('holdMinutes', `holdMinutes must be a whole number from ${MIN_HOLD_MINUTES} to ${MAX_HOLD_MINUTES}`);
  }
  return new Date(now.getTime() + holdMinutes * 60_000);
}

/** True when a reservation that ends at `until` has run out at `now` (the end itself counts as expired). */
export function reservationExpired(until: Date | string | null, now: Date): boolean {
  if (until === null) return false;
  const t = typeof until === 'string' ? Date.parse(until) : until.getTime();
  return t <= now.getTime();
}
