import { MoistureInputError } from './errors.ts';
import { FLOOR_LIFE_CONDITIONS, MSL_FLOOR_LIFE, requireMslLevel, type MslLevel } from './msl-levels.ts';

export type FloorLifeState = 'not-applicable' | 'ok' | 'warning' | 'expired';

export interface FloorLifeInput {
  /** MSL as printed on the label ('3', 'MSL 3', '2a' …). */
  level: string;
  /** When the dry bag was opened (or the parts came out of dry storage / the bake). */
  openedAt: Date;
  /** The current time, passed in by the caller. */
  now: Date;
  /** Fraction of the floor life after which the state is 'warning'; default 0.8 [common practice]. */
  warnAtFraction?: number;
  /** Exposure in hours already used up before `openedAt` (earlier openings), default 0. */
  cumulativeExposureHours?: number;
  /** MSL 6 only: the time on the label in hours, which applies after the mandatory bake. */
  timeOnLabelHours?: number;
}

export interface FloorLifeStatus {
  level: MslLevel;
  state: FloorLifeState;
  /** Floor life that applies, in hours; null when no clock runs. */
  floorLifeHours: number | null;
  /** Hours of ambient exposure so far, including `cumulativeExposureHours`; null when no clock runs. */
  exposureHours: number | null;
  /** Hours left before the floor life runs out, never below 0; null when no clock runs. */
  hoursLeft: number | null;
  /** When the floor life runs out if the parts stay out; null when no clock runs. */
  expiresAt: Date | null;
  message: string;
}

const MS_PER_HOUR = 3_600_000;

/** Levels whose opened dry bag starts the J-STD-033 clock (product brief: MSL 2a–6). */
const CLOCKED_LEVELS: ReadonlySet<MslLevel> = new Set<MslLevel>(['2a', '3', '4', '5', '5a', '6']);

const LOCAL_PROCEDURE = "follow J-STD-033 and your site's moisture-control procedure";

/**
 * Where an opened dry bag stands on its J-STD-033 floor-life clock.
 *
 * Exposure (hours) = cumulativeExposureHours + (now − openedAt). The state is 'expired' once
 * exposure ≥ floor life, 'warning' once exposure ≥ warnAtFraction × floor life, otherwise 'ok'.
 * Only MSL 2a–6 start the clock; MSL 1 (unlimited) and MSL 2 (one year) are 'not-applicable'.
 * MSL 6 must be baked before use: without `timeOnLabelHours` it is 'expired' at once; with it,
 * that time is the floor life counted from `openedAt` (the end of the bake).
 * Assumes ambient ≤ 30 °C / 60 % RH; hotter or wetter floors shorten the floor life, which this
 * function does not model. Floor-life hours are [from memory] (reference.md §6). Through-hole
 * parts are usually not classified and need no clock.
 * @throws MoistureInputError naming the field for an unknown level, invalid dates, `now`
 * before `openedAt`, a warn fraction outside (0, 1], or negative hours.
 */
export function floorLifeStatus(input: FloorLifeInput): FloorLifeStatus {
  const level = requireMslLevel(input.level);
  const warnAtFraction = input.warnAtFraction ?? 0.8;
  const cumulative = input.cumulativeExposureHours ?? 0;

  requireValidDate(input.openedAt, 'openedAt');
  requireValidDate(input.now, 'now');
  if (!(warnAtFraction > 0 && warnAtFraction <= 1)) {
    throw new MoistureInputError('warnAtFraction must be greater than 0 and at most 1', 'warnAtFraction');
  }
  requireNonNegativeHours(cumulative, 'cumulativeExposureHours');
  if (input.timeOnLabelHours !== undefined) requireNonNegativeHours(input.timeOnLabelHours, 'timeOnLabelHours');

  const label = `MSL ${level}`;
  if (!CLOCKED_LEVELS.has(level)) {
    return {
      level,
      state: 'not-applicable',
      floorLifeHours: MSL_FLOOR_LIFE[level].hours,
      exposureHours: null,
      hoursLeft: null,
      expiresAt: null,
      message: `${label}: floor life ${MSL_FLOOR_LIFE[level].description}; no floor-life clock is kept.`,
    };
  }

  const sinceOpenedHours = (input.now.getTime() - input.openedAt.getTime()) / MS_PER_HOUR;
  if (sinceOpenedHours < 0) {
    throw new MoistureInputError('now is earlier than openedAt', 'now');
  }

  if (level === '6' && input.timeOnLabelHours === undefined) {
    return {
      level,
      state: 'expired',
      floorLifeHours: 0,
      exposureHours: cumulative + sinceOpenedHours,
      hoursLeft: 0,
      expiresAt: new Date(input.openedAt.getTime()),
      message: `${label}: bake before use, then use within the time on the label; ${LOCAL_PROCEDURE}.`,
    };
  }

  const floorLife = level === '6' ? (input.timeOnLabelHours as number) : (MSL_FLOOR_LIFE[level].hours as number);
  const exposure = cumulative + sinceOpenedHours;
  const left = floorLife - exposure;
  const expiresAt = new Date(input.openedAt.getTime() + (floorLife - cumulative) * MS_PER_HOUR);
  const conditions = `at ${FLOOR_LIFE_CONDITIONS}`;

  let state: FloorLifeState;
  let message: string;
  if (exposure >= floorLife) {
    state = 'expired';
    message =
      `${label}: floor life of ${floorLife} h ${conditions} exceeded by ${hours(-left)}; ` +
      `bake the parts before reflow — ${LOCAL_PROCEDURE}.`;
  } else if (exposure >= warnAtFraction * floorLife) {
    state = 'warning';
    message =
      `${label}: only ${hours(left)} of floor life left (${floorLife} h ${conditions}), ` +
      `runs out ${expiresAt.toISOString()}; mount the parts or return them to dry storage — ${LOCAL_PROCEDURE}.`;
  } else {
    state = 'ok';
    message = `${label}: ${hours(left)} of floor life left (${floorLife} h ${conditions}), runs out ${expiresAt.toISOString()}.`;
  }

  return {
    level,
    state,
    floorLifeHours: floorLife,
    exposureHours: exposure,
    hoursLeft: Math.max(0, left),
    expiresAt,
    message,
  };
}

function hours(value: number): string {
  return `${value.toFixed(1)} h`;
}

function requireValidDate(value: Date, field: string): void {
  if (!(value instanceof Date) || Number.isNaN(value.getTime())) {
    throw new MoistureInputError(`${field} is not a valid date`, field);
  }
}

function requireNonNegativeHours(value: number, field: string): void {
  if (!Number.isFinite(value) || value < 0) {
    throw new MoistureInputError(`${field} must be a finite number of hours ≥ 0`, field);
  }
}
