/**
 * What the bench may still record on a lot, from its status and its signed MRB action:
 * - `open`: before the disposition is signed (received, inspecting, awaiting signature) — sample
 *   and 100 % screening sessions;
 * - `screen-only`: the signed disposition is MRB with the action "100 % screen" — the lot is
 *   screened part by part into gain bins, so screening sessions go on while the sample the
 *   disposition rests on stays closed;
 * - `closed`: any other signed disposition (accept, reject, MRB use as is / return / scrap).
 * Product rule.
 */
export type BenchWork = 'open' | 'screen-only' | 'closed';

/** The MRB action after which a lot is screened 100 % (shared/api/disposition MRB_ACTIONS). */
export const SCREEN_AFTER_SIGNING_ACTION = 'screen-100';

const OPEN_STATUSES: readonly string[] = ['received', 'inspecting', 'awaiting-signature'];

export function benchWorkFor(lotStatus: string, signedMrbAction: string | null): BenchWork {
  if (OPEN_STATUSES.includes(lotStatus)) return 'open';
  if (lotStatus === 'mrb' && signedMrbAction === SCREEN_AFTER_SIGNING_ACTION) return 'screen-only';
  return 'closed';
}

/** Whether a session of `mode` may record on a lot whose bench work is `work`. */
export function modeAllowed(work: BenchWork, mode: 'sample' | 'screen'): boolean {
  return work === 'open' || (work === 'screen-only' && mode === 'screen');
}
