import { MoistureInputError } from './errors.ts';

/** Moisture sensitivity levels of IPC/JEDEC J-STD-020, from least to most sensitive. */
export const MSL_LEVELS = ['1', '2', '2a', '3', '4', '5', '5a', '6'] as const;

export type MslLevel = (typeof MSL_LEVELS)[number];

/** Ambient conditions the floor-life table assumes (J-STD-033). */
export const FLOOR_LIFE_CONDITIONS = '≤ 30 °C / 60 % RH';

export interface MslFloorLife {
  level: MslLevel;
  /** Floor life in hours out of the dry bag; null = unlimited; 0 = bake before use. */
  hours: number | null;
  /** Plain-language floor life as the label states it. */
  description: string;
  /** Provenance tag as used in reference.md. */
  source: string;
}

const FROM_MEMORY = 'J-STD-033 floor-life table [from memory, consistent with several published summaries]';

/**
 * Floor life per level at ≤ 30 °C / 60 % RH (MSL 1: ≤ 30 °C / 85 % RH), J-STD-033.
 * Values are [from memory] per reference.md §6: confirm against the purchased standard.
 * One year is taken as 365 × 24 h and four weeks as 28 × 24 h.
 */
export const MSL_FLOOR_LIFE: Readonly<Record<MslLevel, MslFloorLife>> = {
  '1': { level: '1', hours: null, description: 'unlimited at ≤ 30 °C / 85 % RH', source: FROM_MEMORY },
  '2': { level: '2', hours: 365 * 24, description: 'one year', source: FROM_MEMORY },
  '2a': { level: '2a', hours: 28 * 24, description: 'four weeks', source: FROM_MEMORY },
  '3': { level: '3', hours: 168, description: '168 hours', source: FROM_MEMORY },
  '4': { level: '4', hours: 72, description: '72 hours', source: FROM_MEMORY },
  '5': { level: '5', hours: 48, description: '48 hours', source: FROM_MEMORY },
  '5a': { level: '5a', hours: 24, description: '24 hours', source: FROM_MEMORY },
  '6': {
    level: '6',
    hours: 0,
    description: 'bake before use, then use within the time on the label',
    source: FROM_MEMORY,
  },
};

const MSL_TEXT = /^(?:MSL|LEVEL|LVL)?[\s:_-]*(1|2A|2|3|4|5A|5|6)$/i;

/**
 * Reads a moisture sensitivity level as labels write it ("3", "MSL 3", "Level 2A", "msl-5a")
 * and returns the J-STD-020 level in canonical form ('2a', not '2A'); null when unrecognised.
 */
export function normaliseMslLevel(text: string): MslLevel | null {
  const match = MSL_TEXT.exec(text.trim());
  if (!match) return null;
  return match[1].toLowerCase() as MslLevel;
}

/**
 * Floor life in hours for an MSL at ≤ 30 °C / 60 % RH (J-STD-033, values [from memory] per
 * reference.md §6). Returns null for MSL 1 (unlimited) and 0 for MSL 6 (bake before use, then
 * the time on the label applies). Accepts any spelling `normaliseMslLevel` understands.
 * @throws MoistureInputError (field `level`) when the level is not recognised.
 */
export function floorLifeHours(level: string): number | null {
  return MSL_FLOOR_LIFE[requireMslLevel(level)].hours;
}

/** Normalises a level or throws MoistureInputError naming `field`. */
export function requireMslLevel(level: string, field = 'level'): MslLevel {
  const normalised = normaliseMslLevel(level);
  if (normalised === null) {
    throw new MoistureInputError(
      `"${level}" is not a J-STD-020 moisture sensitivity level (expected one of ${MSL_LEVELS.join(', ')})`,
      field,
    );
  }
  return normalised;
}
