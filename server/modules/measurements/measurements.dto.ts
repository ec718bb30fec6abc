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
