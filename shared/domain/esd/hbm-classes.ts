import { EsdInputError } from './errors.ts';

export type EsdHbmClassId = '0Z' | '0A' | '0B' | '1A' | '1B' | '1C' | '2' | '3A' | '3B';

export interface EsdHbmClass {
  id: EsdHbmClassId;
  /** Lowest HBM withstand voltage of the class, volts (inclusive). */
  minVolts: number;
  /** Upper bound, volts (exclusive); null for the open-ended top class. */
  belowVolts: number | null;
  /** Provenance tag as used in reference.md. */
  source: string;
}

const PUBLISHED = 'ANSI/ESDA/JEDEC JS-001 HBM classification [published]';
const SPLIT_FROM_MEMORY = 'ANSI/ESDA/JEDEC JS-001 HBM classification [published; 0Z/0A split from memory]';

/**
 * Human-body-model ESD sensitivity classes of ANSI/ESDA/JEDEC JS-001 (reference.md §6), ordered
 * from most to least sensitive. Each class covers minVolts ≤ V < belowVolts.
 */
export const ESD_HBM_CLASSES: readonly EsdHbmClass[] = [
  { id: '0Z', minVolts: 0, belowVolts: 50, source: SPLIT_FROM_MEMORY },
  { id: '0A', minVolts: 50, belowVolts: 125, source: SPLIT_FROM_MEMORY },
  { id: '0B', minVolts: 125, belowVolts: 250, source: PUBLISHED },
  { id: '1A', minVolts: 250, belowVolts: 500, source: PUBLISHED },
  { id: '1B', minVolts: 500, belowVolts: 1000, source: PUBLISHED },
  { id: '1C', minVolts: 1000, belowVolts: 2000, source: PUBLISHED },
  { id: '2', minVolts: 2000, belowVolts: 4000, source: PUBLISHED },
  { id: '3A', minVolts: 4000, belowVolts: 8000, source: PUBLISHED },
  { id: '3B', minVolts: 8000, belowVolts: null, source: PUBLISHED },
];

/**
 * Caution shown wherever parts are handled. Programme elements from ANSI/ESD S20.20
 * (reference.md §6); it defers to the site's own ESD control plan.
 */
export const ESD_CAUTION_TEXT =
  'Electrostatic-sensitive devices: handle only at an ESD-protected workstation (ANSI/ESD S20.20). ' +
  'Ground yourself with a wrist strap when seated, keep parts in ESD-protective packaging until use, ' +
  "and follow your site's ESD control procedures.";

/**
 * The JS-001 HBM class of a part from its HBM withstand voltage in volts (the highest test
 * voltage it passes); classes are half-open intervals minVolts ≤ V < belowVolts.
 * @throws EsdInputError (field `volts`) for a negative or non-finite voltage.
 */
export function esdClassForVoltage(volts: number): EsdHbmClass {
  if (!Number.isFinite(volts) || volts < 0) {
    throw new EsdInputError('HBM withstand voltage must be a finite number of volts ≥ 0', 'volts');
  }
  const found = ESD_HBM_CLASSES.find((c) => volts >= c.minVolts && (c.belowVolts === null || volts < c.belowVolts));
  // The classes cover [0, ∞) without gaps, so a match always exists.
  return found as EsdHbmClass;
}

/** Voltage range of an HBM class for display, e.g. "250 V to < 500 V" or "≥ 8000 V". */
export function describeEsdClass(esdClass: EsdHbmClass): string {
  if (esdClass.belowVolts === null) return `≥ ${esdClass.minVolts} V`;
  if (esdClass.minVolts === 0) return `< ${esdClass.belowVolts} V`;
  return `${esdClass.minVolts} V to < ${esdClass.belowVolts} V`;
}
