import { IsIn, IsInt, IsNumber, IsOptional, IsString, Max, MaxLength, Min, MinLength, ValidateIf } from 'class-validator';
import type { CorrectMeasurementRequest, CurrentUnit, RecordMeasurementRequest, SessionMode, StartSessionRequest, VoltageUnit } from '../../../shared/api/measurements.ts';

const VOLT: VoltageUnit[] = ['mV', 'V'];
const AMP: CurrentUnit[] = ['nA', 'uA'];

export class StartSessionDto implements StartSessionRequest {
  @IsString({ message: 'instrument must be text' })
  @MinLength(2, { message: 'instrument must name the tester or meter (at least 2 characters)' })
  @MaxLength(80)
  instrument: string;

  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'ambientC must be a number (°C)' })
  @Min(-39, { message: 'ambientC must be above −40 °C' })
  @Max(84, { message: 'ambientC must be below 85 °C' })
  ambientC: number;

  @IsIn(['sample', 'screen'], { message: 'mode must be sample or screen' })
  mode: SessionMode;
}

class ReadingFields {
  @IsInt({ message: 'sessionId must be a whole number' })
  @Min(1)
  sessionId: number;

  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'hfe must be a number' })
  hfe: number;

  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'vbe must be a number' })
  vbe: number;

  @IsIn(VOLT, { message: 'vbeUnit must be mV or V' })
  vbeUnit: VoltageUnit;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'vceSat must be a number' })
  vceSat?: number | null;

  @IsOptional()
  @IsIn(VOLT, { message: 'vceSatUnit must be mV or V' })
  vceSatUnit?: VoltageUnit;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'leakage must be a number' })
  leakage?: number | null;

  @IsOptional()
  @IsIn(AMP, { message: 'leakageUnit must be nA or uA' })
  leakageUnit?: CurrentUnit;
}

export class RecordMeasurementDto extends ReadingFields implements RecordMeasurementRequest {
  @IsInt({ message: 'position must be a whole number' })
  @Min(1, { message: 'position must be 1 or more' })
  position: number;
}

export class CorrectMeasurementDto extends ReadingFields implements CorrectMeasurementRequest {
  @IsString({ message: 'reason must be text' })
  @MinLength(3, { message: 'reason must say why the reading is corrected (at least 3 characters)' })
  @MaxLength(300)
  reason: string;
}

const READING_KEYS = new Set(['sessionId', 'position', 'hfe', 'vbe', 'vbeUnit', 'vceSat', 'vceSatUnit', 'leakage', 'leakageUnit']);
const finite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
const count = (v: unknown): v is number => typeof v === 'number' && Number.isInteger(v) && v >= 1;
const absent = (v: unknown) => v === undefined || v === null;

/**
 * The body itself when it plainly passes RecordMeasurementDto's rules (only its fields; whole
 * numbers ≥ 1 for sessionId and position; finite numbers; known units; optional values absent
 * or null), else null — and then parseBody gives the field errors. A shortcut for the reading
 * lane (reading-lane.ts): class-validator allocated ~27 kB per reading. It never accepts a body
 * parseBody refuses (tests/server/reading-lane.test.ts compares the two on a corpus of bodies).
 */
export function plainReading(body: unknown): RecordMeasurementRequest | null {
  if (body === null || typeof body !== 'object' || Array.isArray(body)) return null;
  const b = body as Record<string, unknown>;
  for (const k in b) if (!READING_KEYS.has(k) || !Object.prototype.hasOwnProperty.call(b, k)) return null;
  if (!count(b.sessionId) || !count(b.position) || !finite(b.hfe) || !finite(b.vbe)) return null;
  if (b.vbeUnit !== 'mV' && b.vbeUnit !== 'V') return null;
  if (!absent(b.vceSat) && !finite(b.vceSat)) return null;
  if (!absent(b.vceSatUnit) && b.vceSatUnit !== 'mV' && b.vceSatUnit !== 'V') return null;
  if (!absent(b.leakage) && !finite(b.leakage)) return null;
  if (!absent(b.leakageUnit) && b.leakageUnit !== 'nA' && b.leakageUnit !== 'uA') return null;
  return b as unknown as RecordMeasurementRequest;
}
