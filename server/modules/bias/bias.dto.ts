import { Type } from 'class-transformer';
import { IsDefined, IsInt, IsNumber, IsOptional, Max, Min, ValidateNested } from 'class-validator';
import type { BiasEvaluateRequest, BiasStage, FitForUseRequest } from '../../../shared/api/bias.ts';
import { FINITE } from '../../http/dto-rules.ts';

const num = (field: string, unit: string) => IsNumber(FINITE, { message: `${field} must be a number (${unit})` });

/** Plausible bench limits; the domain checks signs and the physics. */
export class BiasStageDto implements BiasStage {
  @num('vcc', 'V')
  @Min(0, { message: 'vcc must be greater than 0 V' })
  @Max(1000, { message: 'vcc must be at most 1000 V' })
  vcc: number;

  @num('r1', 'Ω')
  @Min(0, { message: 'r1 must be greater than 0 Ω' })
  @Max(1e9, { message: 'r1 must be at most 1 GΩ' })
  r1: number;

  @num('r2', 'Ω')
  @Min(0, { message: 'r2 must be greater than 0 Ω' })
  @Max(1e9, { message: 'r2 must be at most 1 GΩ' })
  r2: number;

  @num('re', 'Ω')
  @Min(0, { message: 're must not be negative' })
  @Max(1e9, { message: 're must be at most 1 GΩ' })
  re: number;

  @num('rc', 'Ω')
  @Min(0, { message: 'rc must not be negative (0: no collector resistor)' })
  @Max(1e9, { message: 'rc must be at most 1 GΩ' })
  rc: number;
}

export class BiasEvaluateDto extends BiasStageDto implements BiasEvaluateRequest {
  @num('hfe', 'dimensionless')
  @Min(0, { message: 'hfe must be greater than 0' })
  @Max(100000, { message: 'hfe must be at most 100 000' })
  hfe: number;

  @num('vbeV', 'V')
  @Min(0, { message: 'vbeV must not be negative (give |Vbe| in volts, e.g. 0.65)' })
  @Max(5, { message: 'vbeV must be at most 5 V (give volts, e.g. 0.65, not mV)' })
  vbeV: number;
}

export class FitForUseDto implements FitForUseRequest {
  @IsOptional()
  @IsInt({ message: 'lotId must be a whole number' })
  @Min(1, { message: 'lotId must be 1 or more' })
  lotId?: number;

  @IsOptional()
  @IsInt({ message: 'partTypeId must be a whole number' })
  @Min(1, { message: 'partTypeId must be 1 or more' })
  partTypeId?: number;

  @IsDefined({ message: 'stage is required: vcc, r1, r2, re, rc' })
  @ValidateNested()
  @Type(() => BiasStageDto)
  stage: BiasStageDto;
}
