import { DriftInputError } from './errors.ts';

/** ln Γ(x) for x > 0 by the Lanczos approximation (g = 7, n = 9; about 15 significant digits). */
function logGamma(x: number): number {
  const c = [
    0.9999999999998099, 676.5203681218851, -1259.1392167224028, 771.3234287776531, -176.6150291621406, 12.507343278686905,
    -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
  ];
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x);
  const z = x - 1;
  let a = c[0] as number;
  const t = z + 7.5;
  for (let i = 1; i < 9; i++) a += (c[i] as number) / (z + i);
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(a);
}

/**
 * c₄(n) = √(2/(n − 1))·Γ(n/2)/Γ((n − 1)/2), the bias factor of the sample standard deviation of n
 * normal readings: E[s] = c₄·σ (NIST/SEMATECH e-Handbook §6.3.2, "Shewhart X-bar and s charts").
 */
export function c4(n: number): number {
  if (!Number.isInteger(n) || n < 2) throw new DriftInputError('n', 'c4 needs a whole subgroup size ≥ 2');
  return Math.sqrt(2 / (n - 1)) * Math.exp(logGamma(n / 2) - logGamma((n - 1) / 2));
}

/** The X̄ and s chart constants for subgroups of n: A₃ = 3/(c₄√n), B₃ = max(0, 1 − 3√(1 − c₄²)/c₄), B₄ = 1 + 3√(1 − c₄²)/c₄. */
export function xbarSConstants(n: number): { c4: number; a3: number; b3: number; b4: number } {
  const k = c4(n);
  const spread = (3 * Math.sqrt(1 - k * k)) / k;
  return { c4: k, a3: 3 / (k * Math.sqrt(n)), b3: Math.max(0, 1 - spread), b4: 1 + spread };
}

/** One lot as a subgroup: its number of readings, mean and sample standard deviation (n − 1 divisor). */
export interface Subgroup {
  n: number;
  mean: number;
  sd: number;
}

export interface SubgroupLimits {
  n: number;
  mean: number;
  sd: number;
  xbar: { lcl: number; centre: number; ucl: number };
  s: { lcl: number; centre: number; ucl: number };
  /** The lot's mean or sd lies outside its limits. */
  outsideXbar: boolean;
  outsideS: boolean;
}

export interface XbarSChart {
  /** 'constant-n': classical A₃/B₃/B₄ limits; 'variable-n': per-lot limits from the pooled σ̂. */
  method: 'constant-n' | 'variable-n';
  /** Grand mean x̿ (weighted by n for variable n). */
  grandMean: number;
  /** s̄ (constant n) or the pooled standard deviation σ̂ (variable n). */
  sBar: number;
  subgroups: number;
  points: SubgroupLimits[];
}

/**
 * X̄ and s control-chart limits across lots, each lot one subgroup (its hFE readings).
 *
 * Constant n (NIST/SEMATECH e-Handbook §6.3.2): x̿ = mean of the lot means, s̄ = mean of the lot
 * standard deviations; X̄ chart x̿ ± A₃·s̄; s chart B₃·s̄ … B₄·s̄ with centre s̄.
 *
 * Variable n (lots sampled with different plans): the limits are drawn per lot from the per-lot
 * standard error. σ̂ is the pooled standard deviation √(Σ(nᵢ − 1)sᵢ² / (Σnᵢ − m)) and x̿ the
 * n-weighted grand mean (as in D. C. Montgomery, Introduction to Statistical Quality Control,
 * §6.3.2, x̄ and s charts with variable sample size); lot i gets X̄ limits x̿ ± 3·σ̂/√nᵢ and s
 * limits max(0, c₄ − 3√(1 − c₄²))·σ̂ … (c₄ + 3√(1 − c₄²))·σ̂ around c₄(nᵢ)·σ̂. The small bias of
 * the pooled s as an estimate of σ is ignored (it is below 1 % once Σnᵢ − m ≥ 25).
 *
 * The limits are estimated from `reference` (by default the lots themselves; e.g. only the accepted
 * lots, so a lot that was rejected does not widen the limits it is judged by) and drawn for every
 * lot of `lots`. Lots with fewer than two readings carry no standard deviation and are left out.
 * Needs at least two reference lots. Units are those of the input (hFE).
 */
export function xbarSChart(lots: readonly Subgroup[], reference: readonly Subgroup[] = lots): XbarSChart {
  const check = (list: readonly Subgroup[], field: string) => {
    list.forEach((g, i) => {
      if (!Number.isInteger(g.n) || !Number.isFinite(g.mean) || !(g.sd >= 0)) throw new DriftInputError(`${field}[${i}]`, 'each lot needs a whole n, a finite mean and sd ≥ 0');
    });
    return list.filter((g) => g.n >= 2);
  };
  const groups = check(lots, 'lots');
  const ref = check(reference, 'reference');
  if (ref.length < 2) throw new DriftInputError('reference', 'control limits need at least two lots with two or more readings each');
  const n0 = (ref[0] as Subgroup).n;
  const constant = [...ref, ...groups].every((g) => g.n === n0);
  if (constant) {
    const n = n0;
    const k = xbarSConstants(n);
    const grandMean = ref.reduce((a, g) => a + g.mean, 0) / ref.length;
    const sBar = ref.reduce((a, g) => a + g.sd, 0) / ref.length;
    const xbar = { lcl: grandMean - k.a3 * sBar, centre: grandMean, ucl: grandMean + k.a3 * sBar };
    const s = { lcl: k.b3 * sBar, centre: sBar, ucl: k.b4 * sBar };
    return {
      method: 'constant-n',
      grandMean,
      sBar,
      subgroups: ref.length,
      points: groups.map((g) => ({ ...g, xbar, s, outsideXbar: g.mean < xbar.lcl || g.mean > xbar.ucl, outsideS: g.sd < s.lcl || g.sd > s.ucl })),
    };
  }
  const total = ref.reduce((a, g) => a + g.n, 0);
  const grandMean = ref.reduce((a, g) => a + g.n * g.mean, 0) / total;
  const sigma = Math.sqrt(ref.reduce((a, g) => a + (g.n - 1) * g.sd * g.sd, 0) / (total - ref.length));
  return {
    method: 'variable-n',
    grandMean,
    sBar: sigma,
    subgroups: ref.length,
    points: groups.map((g) => {
      const se = sigma / Math.sqrt(g.n);
      const k = c4(g.n);
      const band = 3 * Math.sqrt(1 - k * k);
      const xbar = { lcl: grandMean - 3 * se, centre: grandMean, ucl: grandMean + 3 * se };
      const s = { lcl: Math.max(0, k - band) * sigma, centre: k * sigma, ucl: (k + band) * sigma };
      return { ...g, xbar, s, outsideXbar: g.mean < xbar.lcl || g.mean > xbar.ucl, outsideS: g.sd < s.lcl || g.sd > s.ucl };
    }),
  };
}
