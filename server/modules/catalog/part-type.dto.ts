import { IsBoolean, IsIn, IsNumber, IsOptional, IsString, Matches, Max, MaxLength, Min, MinLength } from 'class-validator';
import { MSL_CHOICES, POLARITIES, type MslChoice, type PartTypeInput, type PartTypeUpdate, type Polarity } from '../../../shared/api/catalog.ts';
import { ESD_HBM_CLASSES } from '../../../shared/domain/esd/index.ts';
import { AQL_VALUES, INSPECTION_LEVELS, SAMPLING_METHODS, type SamplingMethod } from '../../../shared/domain/sampling/index.ts';
import { FINITE, OptionalNotNull, Rules, Trim } from '../../http/dto-rules.ts';

const ESD_IDS = ESD_HBM_CLASSES.map((c) => c.id);

/** A positive, finite number; the message names the field and its unit. */
const positive = (field: string, unit: string, max: number) => {
  const u = unit ? ` ${unit}` : '';
  return Rules(
    IsNumber(FINITE, { message: `${field} must be a number${unit ? ` (${unit})` : ''}` }),
    Min(Number.MIN_VALUE, { message: `${field} must be greater than 0${u}` }),
    Max(max, { message: `${field} must be at most ${max}${u}` }),
  );
};

/** Field rules shared by create and update. */
const R = {
  partNumber: Rules(
    Trim(),
    IsString({ message: 'partNumber must be text' }),
    MinLength(2, { message: 'partNumber must have at least 2 characters' }),
    MaxLength(60, { message: 'partNumber must have at most 60 characters' }),
    Matches(/^[A-Za-z0-9][A-Za-z0-9 ._/+-]*$/, { message: 'partNumber may hold letters, digits, space and . _ / + - only, starting with a letter or digit' }),
  ),
  description: Rules(
    Trim(),
    IsString({ message: 'description must be text' }),
    MinLength(2, { message: 'description must have at least 2 characters' }),
    MaxLength(200, { message: 'description must have at most 200 characters' }),
  ),
  polarity: IsIn(POLARITIES as unknown as string[], { message: 'polarity must be NPN or PNP' }),
  packageName: Rules(
    Trim(),
    IsString({ message: 'packageName must be text' }),
    MinLength(1, { message: 'packageName must not be empty' }),
    MaxLength(40, { message: 'packageName must have at most 40 characters' }),
  ),
  hfeIcMa: positive('hfeIcMa', 'mA', 100_000),
  hfeVceV: positive('hfeVceV', 'V', 2_000),
  vbeIcMa: positive('vbeIcMa', 'mA', 100_000),
  hfeMin: positive('hfeMin', '', 100_000),
  hfeMax: positive('hfeMax', '', 100_000),
  vbeMinMv: positive('vbeMinMv', 'mV', 5_000),
  vbeMaxMv: positive('vbeMaxMv', 'mV', 5_000),
  vbeTcMvPerC: Rules(
    IsNumber(FINITE, { message: 'vbeTcMvPerC must be a number (mV/°C)' }),
    Min(-10, { message: 'vbeTcMvPerC must be between −10 and 10 mV/°C (about −2 is common)' }),
    Max(10, { message: 'vbeTcMvPerC must be between −10 and 10 mV/°C (about −2 is common)' }),
  ),
  hfeTcPctPerC: Rules(
    IsNumber(FINITE, { message: 'hfeTcPctPerC must be a number (%/°C)' }),
    Min(-5, { message: 'hfeTcPctPerC must be between −5 and 5 %/°C' }),
    Max(5, { message: 'hfeTcPctPerC must be between −5 and 5 %/°C' }),
  ),
  msl: IsIn(MSL_CHOICES as unknown as string[], { message: `msl must be one of ${MSL_CHOICES.join(', ')}` }),
  esdHbmClass: IsIn(ESD_IDS, { message: `esdHbmClass must be one of ${ESD_IDS.join(', ')} (JS-001 HBM), or empty` }),
  samplingMethod: IsIn(SAMPLING_METHODS as unknown as string[], { message: `samplingMethod must be one of ${SAMPLING_METHODS.join(', ')}` }),
  inspectionLevel: IsIn(INSPECTION_LEVELS as unknown as string[], { message: `inspectionLevel must be one of ${INSPECTION_LEVELS.join(', ')}` }),
  aql: IsIn(AQL_VALUES as unknown as number[], { message: `aql must be one of ${AQL_VALUES.join(', ')} (%)` }),
  matchHfePct: positive('matchHfePct', '%', 100),
  matchVbeMv: positive('matchVbeMv', 'mV', 100),
  active: IsBoolean({ message: 'active must be true or false' }),
};

export class CreatePartTypeDto implements PartTypeInput {
  @R.partNumber partNumber: string;
  @R.description description: string;
  @R.polarity polarity: Polarity;
  @R.packageName packageName: string;
  @R.hfeIcMa hfeIcMa: number;
  @R.hfeVceV hfeVceV: number;
  @R.vbeIcMa vbeIcMa: number;
  @IsOptional() @R.hfeMin hfeMin?: number | null;
  @IsOptional() @R.hfeMax hfeMax?: number | null;
  @IsOptional() @R.vbeMinMv vbeMinMv?: number | null;
  @IsOptional() @R.vbeMaxMv vbeMaxMv?: number | null;
  @OptionalNotNull() @R.vbeTcMvPerC vbeTcMvPerC?: number;
  @OptionalNotNull() @R.hfeTcPctPerC hfeTcPctPerC?: number;
  @R.msl msl: MslChoice;
  @IsOptional() @R.esdHbmClass esdHbmClass?: string | null;
  @OptionalNotNull() @R.samplingMethod samplingMethod?: SamplingMethod;
  @OptionalNotNull() @R.inspectionLevel inspectionLevel?: string;
  @OptionalNotNull() @R.aql aql?: number;
  @OptionalNotNull() @R.matchHfePct matchHfePct?: number;
  @OptionalNotNull() @R.matchVbeMv matchVbeMv?: number;
  @OptionalNotNull() @R.active active?: boolean;
}

export class UpdatePartTypeDto implements PartTypeUpdate {
  @OptionalNotNull() @R.partNumber partNumber?: string;
  @OptionalNotNull() @R.description description?: string;
  @OptionalNotNull() @R.polarity polarity?: Polarity;
  @OptionalNotNull() @R.packageName packageName?: string;
  @OptionalNotNull() @R.hfeIcMa hfeIcMa?: number;
  @OptionalNotNull() @R.hfeVceV hfeVceV?: number;
  @OptionalNotNull() @R.vbeIcMa vbeIcMa?: number;
  @IsOptional() @R.hfeMin hfeMin?: number | null;
  @IsOptional() @R.hfeMax hfeMax?: number | null;
  @IsOptional() @R.vbeMinMv vbeMinMv?: number | null;
  @IsOptional() @R.vbeMaxMv vbeMaxMv?: number | null;
  @OptionalNotNull() @R.vbeTcMvPerC vbeTcMvPerC?: number;
  @OptionalNotNull() @R.hfeTcPctPerC hfeTcPctPerC?: number;
  @OptionalNotNull() @R.msl msl?: MslChoice;
  @IsOptional() @R.esdHbmClass esdHbmClass?: string | null;
  @OptionalNotNull() @R.samplingMethod samplingMethod?: SamplingMethod;
  @OptionalNotNull() @R.inspectionLevel inspectionLevel?: string;
  @OptionalNotNull() @R.aql aql?: number;
  @OptionalNotNull() @R.matchHfePct matchHfePct?: number;
  @OptionalNotNull() @R.matchVbeMv matchVbeMv?: number;
  @OptionalNotNull() @R.active active?: boolean;
}
