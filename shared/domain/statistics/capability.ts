import { StatisticsInputError } from './errors.ts';

export interface CapabilityInput {
  mean: number;
  /** Process standard deviation, same unit as the limits; must be > 0. */
  sd: number;
  /** Lower specification limit; null or absent when the specification is open below. */
  lsl?: number | null;
  /** Upper specification limit; null or absent when the specification is open above. */
  usl?: number | null;
}

export interface Capability {
  /** (USL − LSL)/6σ; null when the specification is one-sided. */
  cp: number | null;
  /** min(cpl, cpu) over the limits that exist. */
  cpk: number;
  /** (μ − LSL)/3σ; null without a lower limit. */
  cpl: number | null;
  /** (USL − μ)/3σ; null without an upper limit. */
  cpu: number | null;
}

/**
 * Process capability indices Cp = (USL − LSL)/6σ, CPU = (USL − μ)/3σ, CPL = (μ − LSL)/3σ and
 * Cpk = min(CPU, CPL) (NIST/SEMATECH e-Handbook of Statistical Methods §6.1.6). With one limit
 * open the specification is one-sided: Cp is null and Cpk is the index of the limit that exists.
 * Dimensionless.
 */
export function capability(input: CapabilityInput): Capability {
  const { mean, sd } = input;
  const lsl = input.lsl ?? null;
  const usl = input.usl ?? null;
  if (!Number.isFinite(mean)) throw new StatisticsInputError('mean', 'mean must be a finite number');
  if (!(Number.isFinite(sd) && sd > 0)) throw new StatisticsInputError('sd', 'sd must be a positive number');
  if (lsl !== null && !Number.isFinite(lsl)) throw new StatisticsInputError('lsl', 'lsl must be a finite number or null');
  if (usl !== null && !Number.isFinite(usl)) throw new StatisticsInputError('usl', 'usl must be a finite number or null');
  if (lsl === null && usl === null) {
    throw new StatisticsInputError('usl', 'at least one specification limit is needed');
  }
  if (lsl !== null && usl !== null && lsl >= usl) {
    throw new StatisticsInputError('usl', 'usl must be greater than lsl');
  }
  const cpl = lsl === null ? null : (mean - lsl) / (3 * sd);
  const cpu = usl === null ? null : (usl - mean) / (3 * sd);
  const cp = lsl === null || usl === null ? null : (usl - lsl) / (6 * sd);
  const cpk = cpl === null ? (cpu as number) : cpu === null ? cpl : Math.min(cpl, cpu);
  return { cp, cpk, cpl, cpu };
}
