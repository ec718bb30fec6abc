import { MatchingInputError } from './errors.ts';
import type { PairItems } from './items.ts';
import { solveMaxPairs } from './pair-solver.ts';
import { EXACT_QUAD_COMPONENT, solveQuads } from './quads.ts';
import { hfeSpreadPct, setMismatch } from './tolerance.ts';
import type { MatchOptions, MatchPart, MatchResult, MatchedSet, Polarity } from './types.ts';

const PAIRS_METHOD =
  'maximum-cardinality, minimum-mismatch matching: LP relaxation by bipartite assignment, completed by the weighted blossom algorithm (exact)';

/**
 * Matched sets from measured parts: the largest number of sets whose every pair is within both
 * tolerances (hFE by hfeWithinTolerance: |h1 − h2| / min(h1, h2) ≤ t/100; |ΔVbe| ≤ v mV), and
 * among those the smallest total mismatch (setMismatch: hfeSpread/t + vbeSpread/v per set).
 * Pairs, same polarity: a general-graph matching (Edmonds' blossom algorithm; see solveMaxPairs),
 * exact. Complementary pairs: the same solver on the bipartite NPN × PNP graph, comparing |Vbe|,
 * exact. Quads (same polarity only): exact per component of up to EXACT_QUAD_COMPONENT parts,
 * otherwise a pairs-of-pairs heuristic with a proven upper bound (see solveQuads). Complementary
 * quads are refused: "one NPN with one PNP" defines pairs only.
 * Greedy nearest-neighbour pairing is never used: it can lose sets.
 */
export function matchSets(parts: readonly MatchPart[], options: MatchOptions): MatchResult {
  validate(parts, options);
  const { hfeTolerancePct, vbeToleranceMv, setSize, mode } = options;

  const groups: number[][] =
    mode === 'complementary'
      ? [parts.map((_, i) => i)]
      : (['NPN', 'PNP'] as Polarity[]).map((pol) => parts.flatMap((p, i) => (p.polarity === pol ? [i] : [])));

  const hfeOf = Float64Array.from(parts, (p) => p.hfe);
  const sets: { members: number[]; first: number; set: MatchedSet }[] = [];
  let optimal = true;
  let upperBound = 0;
  let heuristicComponents = 0;
  for (const group of groups) {
    if (group.length < setSize) continue;
    // Items sorted by hFE (ties by input order), as the window scans need.
    const order = group.slice().sort((a, b) => (hfeOf[a] as number) - (hfeOf[b] as number) || a - b);
    const vbeOf = (i: number): number =>
      mode === 'complementary' ? Math.abs((parts[i] as MatchPart).vbeMv) : (parts[i] as MatchPart).vbeMv;
    const h = Float64Array.from(order, (i) => (parts[i] as MatchPart).hfe);
    const v = Float64Array.from(order, vbeOf);
    const items: PairItems = {
      n: order.length,
      hLo: h,
      hHi: h,
      vLo: v,
      vHi: v,
      group: mode === 'complementary' ? Uint8Array.from(order, (i) => ((parts[i] as MatchPart).polarity === 'NPN' ? 0 : 1)) : null,
      hfeTolerancePct,
      vbeToleranceMv,
    };
    const found: number[][] = [];
    if (setSize === 2) {
      for (const [a, b] of solveMaxPairs(items).pairs) found.push([order[a] as number, order[b] as number]);
    } else {
      const q = solveQuads(items);
      for (const quad of q.quads) found.push(quad.map((x) => order[x] as number));
      if (!q.optimal) optimal = false;
      upperBound += q.upperBound;
      heuristicComponents += q.heuristicComponents;
    }
    for (const members of found) sets.push({ members, first: Math.min(...members), set: describeSet(parts, members, options) });
    if (setSize === 2) upperBound += found.length;
  }

  sets.sort((x, y) => x.set.mismatch - y.set.mismatch || x.first - y.first);
  const inSet = new Uint8Array(parts.length);
  for (const s of sets) for (const i of s.members) inSet[i] = 1;
  const unmatched = parts.flatMap((p, i) => (inSet[i] ? [] : [p.id]));

  let method: string;
  if (setSize === 2) {
    method = mode === 'complementary' ? `complementary pairs on the bipartite NPN × PNP graph — ${PAIRS_METHOD}` : `pairs within each polarity — ${PAIRS_METHOD}`;
  } else {
    method = `quads within each polarity — exact subset search per compatibility component of up to ${EXACT_QUAD_COMPONENT} parts`;
    if (heuristicComponents > 0) {
      method += `; ${heuristicComponents} larger component(s) by pairing parts, then pairing the pairs (heuristic, with upper bound)`;
    }
  }
  const result: MatchResult = { sets: sets.map((s) => s.set), unmatched, method, optimal };
  return optimal ? result : { ...result, upperBound };
}

function describeSet(parts: readonly MatchPart[], members: number[], options: MatchOptions): MatchedSet {
  const complementary = options.mode === 'complementary';
  if (members.length === 2 && !complementary) {
    // A same-polarity pair: the same result as the general path below, without its sorting.
    const [i, j] = members as [number, number];
    const p = parts[i] as MatchPart;
    const q = parts[j] as MatchPart;
    const pFirst = p.hfe < q.hfe || (p.hfe === q.hfe && i < j);
    const hs = hfeSpreadPct(Math.min(p.hfe, q.hfe), Math.max(p.hfe, q.hfe));
    const vs = Math.max(p.vbeMv, q.vbeMv) - Math.min(p.vbeMv, q.vbeMv);
    return {
      partIds: pFirst ? [p.id, q.id] : [q.id, p.id],
      hfeSpreadPct: hs,
      vbeSpreadMv: vs,
      mismatch: setMismatch(hs, vs, options.hfeTolerancePct, options.vbeToleranceMv),
    };
  }
  const ordered = complementary
    ? members.slice().sort((a, b) => ((parts[a] as MatchPart).polarity === 'NPN' ? -1 : 1) - ((parts[b] as MatchPart).polarity === 'NPN' ? -1 : 1))
    : members.slice().sort((a, b) => (parts[a] as MatchPart).hfe - (parts[b] as MatchPart).hfe || a - b);
  let hlo = Infinity;
  let hhi = -Infinity;
  let vlo = Infinity;
  let vhi = -Infinity;
  for (const i of members) {
    const p = parts[i] as MatchPart;
    const v = complementary ? Math.abs(p.vbeMv) : p.vbeMv;
    hlo = Math.min(hlo, p.hfe);
    hhi = Math.max(hhi, p.hfe);
    vlo = Math.min(vlo, v);
    vhi = Math.max(vhi, v);
  }
  const hs = hfeSpreadPct(hlo, hhi);
  const vs = vhi - vlo;
  return {
    partIds: ordered.map((i) => (parts[i] as MatchPart).id),
    hfeSpreadPct: hs,
    vbeSpreadMv: vs,
    mismatch: setMismatch(hs, vs, options.hfeTolerancePct, options.vbeToleranceMv),
  };
}

function validate(parts: readonly MatchPart[], options: MatchOptions): void {
  if (typeof options !== 'object' || options === null) throw new MatchingInputError('options', 'options are required');
  const { hfeTolerancePct, vbeToleranceMv, setSize, mode } = options;
  if (typeof hfeTolerancePct !== 'number' || !Number.isFinite(hfeTolerancePct) || hfeTolerancePct < 0) {
    throw new MatchingInputError('hfeTolerancePct', 'hfeTolerancePct must be a finite number ≥ 0 (percent)');
  }
  if (typeof vbeToleranceMv !== 'number' || !Number.isFinite(vbeToleranceMv) || vbeToleranceMv < 0) {
    throw new MatchingInputError('vbeToleranceMv', 'vbeToleranceMv must be a finite number ≥ 0 (mV)');
  }
  if (setSize !== 2 && setSize !== 4) throw new MatchingInputError('setSize', 'setSize must be 2 or 4');
  if (mode !== 'same' && mode !== 'complementary') {
    throw new MatchingInputError('mode', 'mode must be "same" or "complementary"');
  }
  if (mode === 'complementary' && setSize !== 2) {
    throw new MatchingInputError('setSize', 'complementary sets are pairs (one NPN with one PNP); setSize must be 2');
  }
  if (!Array.isArray(parts)) throw new MatchingInputError('parts', 'parts must be an array');
  const seen = new Set<string>();
  parts.forEach((p, i) => {
    if (typeof p === 'object' && p !== null && isWellFormed(p) && !seen.has(String(p.id))) {
      seen.add(String(p.id));
      return;
    }
    const at = `parts[${i}]`;
    if (typeof p !== 'object' || p === null) throw new MatchingInputError(at, `${at} must be an object`);
    const id: unknown = p.id;
    if (!((typeof id === 'string' && id.length > 0) || (typeof id === 'number' && Number.isFinite(id)))) {
      throw new MatchingInputError(`${at}.id`, `${at}.id must be a non-empty string or a finite number`);
    }
    // 7 and "7" print the same in a pick list, so they count as the same id.
    const key = String(id);
    if (seen.has(key)) throw new MatchingInputError(`${at}.id`, `${at}.id "${key}" appears more than once`);
    seen.add(key);
    if (p.polarity !== 'NPN' && p.polarity !== 'PNP') {
      throw new MatchingInputError(`${at}.polarity`, `${at}.polarity must be "NPN" or "PNP"`);
    }
    if (typeof p.hfe !== 'number' || !Number.isFinite(p.hfe) || p.hfe <= 0) {
      throw new MatchingInputError(`${at}.hfe`, `${at}.hfe must be a finite number > 0`);
    }
    if (typeof p.vbeMv !== 'number' || !Number.isFinite(p.vbeMv)) {
      throw new MatchingInputError(`${at}.vbeMv`, `${at}.vbeMv must be a finite number (mV)`);
    }
  });
}

/** The common case, checked without building messages; validate names the field otherwise. */
function isWellFormed(p: MatchPart): boolean {
  const id: unknown = p.id;
  return (
    ((typeof id === 'string' && id.length > 0) || (typeof id === 'number' && Number.isFinite(id))) &&
    (p.polarity === 'NPN' || p.polarity === 'PNP') &&
    typeof p.hfe === 'number' &&
    Number.isFinite(p.hfe) &&
    p.hfe > 0 &&
    typeof p.vbeMv === 'number' &&
    Number.isFinite(p.vbeMv)
  );
}
