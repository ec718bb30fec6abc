import { matchSets, type MatchPart } from '../../../shared/domain/matching/index.ts';
import type { SetMatcher } from '../../../shared/domain/planning/index.ts';

/**
 * The matching that order-quantity planning runs on every simulated lot: the real matchSets of
 * shared/domain/matching, same-polarity sets (a simulated lot holds one part type). Part ids are
 * the indexes into the simulated lot, so the unmatched ids are the leftovers.
 */
export const planMatcher: SetMatcher = (parts, t) => {
  const input: MatchPart[] = parts.map((p, i) => ({ id: i, polarity: 'NPN', hfe: p.hfe, vbeMv: p.vbeMv }));
  const r = matchSets(input, { hfeTolerancePct: t.hfeTolerancePct, vbeToleranceMv: t.vbeToleranceMv, setSize: t.setSize, mode: 'same' });
  return { sets: r.sets.length, leftover: r.unmatched as number[] };
};
