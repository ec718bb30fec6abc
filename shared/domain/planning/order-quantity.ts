import { assignBin, type GainBinScheme } from '../binning/index.ts';
import { describe } from '../statistics/index.ts';
import { PlanningInputError } from './errors.ts';
import { mulberry32, standardNormal } from './random.ts';

/** One measured part of the history: hFE and Vbe (mV) at 25 °C. */
export interface PlanPart {
  hfe: number;
  vbeMv: number;
}

export interface MatchTolerance {
  setSize: 2 | 4;
  /** |h1 − h2| / min(h1, h2) in percent. */
  hfeTolerancePct: number;
  vbeToleranceMv: number;
}

/**
 * The matching the simulation runs on every simulated lot: how many disjoint sets it makes and
 * which parts (indexes into `parts`) are left over. The server passes the real matching function.
 */
export type SetMatcher = (parts: readonly PlanPart[], tolerance: MatchTolerance) => { sets: number; leftover: readonly number[] };

export interface OrderPlanInput extends MatchTolerance {
  /** The supplier's measured parts of the part type: the bootstrap pool. */
  history: readonly PlanPart[];
  /** Sets needed (N). */
  setsWanted: number;
  /** Wanted probability of getting at least N sets, 0.5–0.999. */
  confidence: number;
  /** Simulated lots (default 200). */
  simulations?: number;
  /** Largest quantity considered (default max(1 000, 20·setSize·N), at most 20 000). */
  maxQuantity?: number;
  /** Gain bins for the expected leftovers; without, leftovers are reported as one group. */
  bins?: GainBinScheme;
  /** Simulated lots whose leftovers are averaged (default min(simulations, 100)). */
  leftoverSimulations?: number;
}

export interface OrderPlanProgress {
  phase: 'simulating' | 'leftovers';
  done: number;
  total: number;
}

export interface OrderPlanResult {
  /** Smallest quantity Q with P(sets ≥ N) ≥ confidence; null when not reached by maxQuantity. */
  quantity: number | null;
  /** P(sets ≥ N) at that quantity (≥ confidence). */
  probability: number | null;
  confidence: number;
  setsWanted: number;
  /** Step curve: at each quantity where a simulated lot first reached N sets, the share of lots that had by then. */
  curve: { quantity: number; probability: number }[];
  /** Simulated lots that did not reach N sets even at maxQuantity. */
  unreachable: number;
  simulations: number;
  maxQuantity: number;
  /** Quantities at which the simulated lots first reached N sets: summary. */
  thresholds: { min: number; median: number; max: number } | null;
  /** Mean number of sets at the recommended quantity (may exceed N). */
  expectedSets: number | null;
  /** Mean parts left over at the recommended quantity, per gain bin (code null = outside all bins). */
  leftovers: { code: string | null; expected: number }[];
  /** Smoothing bandwidths of the bootstrap (hFE units, mV). */
  bandwidth: { hfe: number; vbeMv: number };
  /** Calls of the matching function. */
  matcherCalls: number;
}

const DEFAULT_SIMULATIONS = 200;

/**
 * Silverman's rule-of-thumb bandwidth h = 0.9·min(s, IQR/1.34)·n^(−1/5) (B. W. Silverman,
 * Density Estimation for Statistics and Data Analysis, 1986, eq. 3.31).
 */
export function silvermanBandwidth(values: ArrayLike<number>): number {
  const d = describe(values);
  const spread = Math.min(d.sd ?? 0, d.iqr / 1.34) || (d.sd ?? 0);
  return 0.9 * spread * Math.pow(values.length, -0.2);
}

function validate(input: OrderPlanInput): Required<Omit<OrderPlanInput, 'bins'>> & { bins?: GainBinScheme } {
  const bad = (field: string, message: string) => new PlanningInputError(field, message);
  if (input.history.length < 20) throw bad('history', `the supplier's history holds ${input.history.length} measured parts; planning needs at least 20`);
  input.history.forEach((p, i) => {
    if (!Number.isFinite(p.hfe) || p.hfe <= 0 || !Number.isFinite(p.vbeMv)) throw bad(`history[${i}]`, 'each part needs a positive hFE and a finite Vbe');
  });
  if (!Number.isInteger(input.setsWanted) || input.setsWanted < 1 || input.setsWanted > 5000) throw bad('setsWanted', 'setsWanted must be a whole number from 1 to 5 000');
  if (input.setSize !== 2 && input.setSize !== 4) throw bad('setSize', 'setSize must be 2 or 4');
  if (!(input.hfeTolerancePct >= 0 && input.hfeTolerancePct <= 100)) throw bad('hfeTolerancePct', 'hfeTolerancePct must lie between 0 and 100');
  if (!(input.vbeToleranceMv >= 0 && input.vbeToleranceMv <= 1000)) throw bad('vbeToleranceMv', 'vbeToleranceMv must lie between 0 and 1 000 mV');
  if (!(input.confidence >= 0.5 && input.confidence <= 0.999)) throw bad('confidence', 'confidence must lie between 0.5 and 0.999');
  const simulations = input.simulations ?? DEFAULT_SIMULATIONS;
  if (!Number.isInteger(simulations) || simulations < 10 || simulations > 5000) throw bad('simulations', 'simulations must be a whole number from 10 to 5 000');
  const minQ = input.setSize * input.setsWanted;
  const maxQuantity = input.maxQuantity ?? Math.min(20_000, Math.max(1000, 20 * minQ));
  if (!Number.isInteger(maxQuantity) || maxQuantity < minQ) throw bad('maxQuantity', `maxQuantity must be a whole number ≥ ${minQ}`);
  const leftoverSimulations = Math.min(simulations, input.leftoverSimulations ?? 100);
  return { ...input, simulations, maxQuantity, leftoverSimulations };
}

/**
 * A simulated lot as an endless stream of parts; a lot of Q parts is the stream's first Q parts.
 * Each part is a smoothed bootstrap draw: a part of the history chosen uniformly, plus Gaussian
 * noise of Silverman's bandwidth, rescaled so the variance stays that of the history
 * (Silverman 1986 §6.4.1). Without the noise, resampling a few hundred readings would hand the
 * matching exact duplicates that pair at zero mismatch and make every plan look too easy.
 */
class LotStream {
  private hfe = new Float64Array(256);
  private vbe = new Float64Array(256);
  private length = 0;
  constructor(
    private readonly pool: readonly PlanPart[],
    private readonly rng: () => number,
    private readonly smooth: Smoothing,
  ) {}

  prefix(q: number): PlanPart[] {
    while (this.length < q) this.grow();
    const out = new Array<PlanPart>(q);
    for (let i = 0; i < q; i++) out[i] = { hfe: this.hfe[i] as number, vbeMv: this.vbe[i] as number };
    return out;
  }

  private grow(): void {
    if (this.length === this.hfe.length) {
      const h = new Float64Array(this.hfe.length * 2);
      h.set(this.hfe);
      this.hfe = h;
      const v = new Float64Array(this.vbe.length * 2);
      v.set(this.vbe);
      this.vbe = v;
    }
    const s = this.smooth;
    const parent = this.pool[Math.min(this.pool.length - 1, Math.floor(this.rng() * this.pool.length))] as PlanPart;
    const h = s.hMean + (parent.hfe - s.hMean + s.hH * standardNormal(this.rng)) * s.hScale;
    this.hfe[this.length] = Math.max(1e-6, h);
    this.vbe[this.length] = s.vMean + (parent.vbeMv - s.vMean + s.vH * standardNormal(this.rng)) * s.vScale;
    this.length++;
  }
}

type Smoothing = { hMean: number; hScale: number; hH: number; vMean: number; vScale: number; vH: number };

function smoothingOf(history: readonly PlanPart[]): Smoothing {
  const hfes = history.map((p) => p.hfe);
  const vbes = history.map((p) => p.vbeMv);
  const dh = describe(hfes);
  const dv = describe(vbes);
  const hH = silvermanBandwidth(hfes);
  const vH = dv.sd ? silvermanBandwidth(vbes) : 0;
  const scale = (sd: number | null, h: number) => (sd && sd > 0 ? 1 / Math.sqrt(1 + (h * h) / (sd * sd)) : 1);
  return { hMean: dh.mean, hScale: scale(dh.sd, hH), hH, vMean: dv.mean, vScale: scale(dv.sd, vH), vH };
}

/**
 * The simulated lot number i of a plan run: orderPlanSteps draws one 32-bit seed per lot from its
 * rng (floor(rng()·2³²)) and builds the lot's stream with this function. Exposed for tests.
 */
export function simulatedLot(history: readonly PlanPart[], seed: number): { prefix(q: number): PlanPart[] } {
  return new LotStream(history, mulberry32(seed), smoothingOf(history));
}

/**
 * The smallest order quantity for N matched sets with a stated confidence, by simulation.
 *
 * Each simulated lot is a seeded stream of smoothed bootstrap draws from the supplier's measured
 * parts (see LotStream). For one lot, sets(Q) — the real matching's number of sets among the
 * first Q parts — never falls as Q grows, and adding or removing one part changes it by at most
 * one. So the first quantity at which the lot reaches N sets is found exactly with few matching
 * calls: from sets(Q) = s < N the threshold is ≥ Q + (N − s); from s ≥ N it is ≤ Q − (s − N);
 * the bracket is then bisected, starting from the median threshold of the lots already done.
 * P(sets ≥ N | Q) is the share of simulated lots whose threshold is ≤ Q (the step curve), and
 * the answer is its smallest Q with P ≥ confidence. The same seed gives the same answer.
 * The two properties hold for an exact matching (every pair solve, and quads within
 * matchSets' exact component size); with a heuristic matching the search still ends, and the
 * threshold is the one its probes bracket.
 *
 * A generator: it yields progress after every simulated lot and returns the result.
 * Randomness comes only from `rng`; `match` is the matching function.
 */
export function* orderPlanSteps(input: OrderPlanInput, rng: () => number, match: SetMatcher): Generator<OrderPlanProgress, OrderPlanResult> {
  const o = validate(input);
  const N = o.setsWanted;
  const tol: MatchTolerance = { setSize: o.setSize, hfeTolerancePct: o.hfeTolerancePct, vbeToleranceMv: o.vbeToleranceMv };
  const smooth = smoothingOf(o.history);

  let matcherCalls = 0;
  const setsAt = (stream: LotStream, q: number) => {
    matcherCalls++;
    return match(stream.prefix(q), tol).sets;
  };

  const minQ = o.setSize * N;
  const allowedUnreachable = Math.floor((1 - o.confidence) * o.simulations + 1e-9);
  const thresholds: number[] = [];
  const seeds: number[] = [];
  let unreachable = 0;
  // Sets gained per part added near the threshold; at most 1/setSize, learnt from the probes.
  let slopeEstimate = 1 / o.setSize;
  for (let sim = 0; sim < o.simulations; sim++) {
    const seed = Math.floor(rng() * 4294967296);
    seeds.push(seed);
    const stream = new LotStream(o.history, mulberry32(seed), smooth);
    let lo = minQ;
    let hi = Number.POSITIVE_INFINITY;
    const sorted = [...thresholds].sort((a, b) => a - b);
    let guess = sorted.length ? (sorted[Math.floor(sorted.length / 2)] as number) : minQ;
    let prev: { q: number; s: number } | null = null;
    while (lo < hi && lo <= o.maxQuantity) {
      const q = Math.min(o.maxQuantity, Math.max(lo, Math.min(hi - 1, guess)));
      const s = setsAt(stream, q);
      if (s >= N) hi = Math.min(hi, q - (s - N));
      else lo = Math.max(lo, q + (N - s));
      // Next probe: the secant through the last two probes predicts where sets(Q) reaches N
      // (slope = sets gained per part added, from the previous lots before a second probe);
      // bisection when the prediction is of no use. Only the number of calls depends on it:
      // the bracket [lo, hi] is exact either way.
      const local = prev && prev.q !== q ? (s - prev.s) / (q - prev.q) : null;
      const slope = local !== null && local > 0 ? Math.min(1, local) : slopeEstimate;
      prev = { q, s };
      if (s >= N) {
        guess = Math.floor(q - (s - N) / slope);
      } else {
        guess = Math.ceil(q + (N - s) / slope);
      }
      if (Number.isFinite(hi) && (guess < lo || guess >= hi)) guess = Math.floor((lo + hi) / 2);
      if (!Number.isFinite(hi) && s === 0) guess = Math.max(lo, 2 * q);
      if (local !== null && local > 0) slopeEstimate = 0.8 * slopeEstimate + 0.2 * Math.min(1, local);
    }
    if (lo > o.maxQuantity) unreachable++;
    else thresholds.push(lo);
    yield { phase: 'simulating', done: sim + 1, total: o.simulations };
    if (unreachable > allowedUnreachable) break;
  }

  const simulations = thresholds.length + unreachable;
  const sorted = [...thresholds].sort((a, b) => a - b);
  const curve: { quantity: number; probability: number }[] = [];
  sorted.forEach((t, i) => {
    const p = (i + 1) / simulations;
    if (curve.length && (curve[curve.length - 1] as { quantity: number }).quantity === t) (curve[curve.length - 1] as { probability: number }).probability = p;
    else curve.push({ quantity: t, probability: p });
  });
  const reached = curve.find((c) => c.probability >= o.confidence - 1e-12) ?? null;
  const quantity = simulations === o.simulations && reached ? reached.quantity : null;

  const leftovers = new Map<string | null, number>();
  for (const b of o.bins ?? []) leftovers.set(b.code, 0);
  leftovers.set(null, 0);
  let expectedSets: number | null = null;
  if (quantity !== null) {
    let setsTotal = 0;
    const runs = o.leftoverSimulations;
    for (let i = 0; i < runs; i++) {
      const stream = new LotStream(o.history, mulberry32(seeds[i] as number), smooth);
      const parts = stream.prefix(quantity);
      matcherCalls++;
      const r = match(parts, tol);
      setsTotal += r.sets;
      for (const idx of r.leftover) {
        const code = o.bins?.length ? assignBin(o.bins, parts[idx] as PlanPart) : null;
        leftovers.set(code, (leftovers.get(code) ?? 0) + 1);
      }
      yield { phase: 'leftovers', done: i + 1, total: runs };
    }
    for (const [k, v] of leftovers) leftovers.set(k, v / runs);
    expectedSets = setsTotal / runs;
  }

  return {
    quantity,
    probability: quantity === null ? null : (reached as { probability: number }).probability,
    confidence: o.confidence,
    setsWanted: N,
    curve,
    unreachable,
    simulations,
    maxQuantity: o.maxQuantity,
    thresholds: sorted.length ? { min: sorted[0] as number, median: sorted[Math.floor(sorted.length / 2)] as number, max: sorted[sorted.length - 1] as number } : null,
    expectedSets,
    leftovers: quantity === null ? [] : [...leftovers].filter(([code, v]) => code !== null || v > 0).map(([code, expected]) => ({ code, expected })),
    bandwidth: { hfe: smooth.hH, vbeMv: smooth.vH },
    matcherCalls,
  };
}

/** Runs orderPlanSteps to the end and returns its result (see there). */
export function planOrderQuantity(input: OrderPlanInput, rng: () => number, match: SetMatcher): OrderPlanResult {
  const steps = orderPlanSteps(input, rng, match);
  for (;;) {
    const next = steps.next();
    if (next.done) return next.value;
  }
}
