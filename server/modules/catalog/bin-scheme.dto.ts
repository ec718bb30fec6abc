import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsBoolean,
  IsNumber,
  IsOptional,
  IsString,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateNested,
} from 'class-validator';
import type { BinSchemeInput, GainBinInput } from '../../../shared/api/catalog.ts';
import { AppError } from '../../http/app-error.ts';
import { FINITE, Trim, TrimToNull } from '../../http/dto-rules.ts';
import { parseBody } from '../../http/validate.ts';

export const MAX_BINS = 40;

export class GainBinDto implements GainBinInput {
  @Trim()
  @IsString({ message: 'code must be text' })
  @MinLength(1, { message: 'code must not be empty' })
  @MaxLength(20, { message: 'code must have at most 20 characters' })
  code: string;

  @Trim()
  @IsString({ message: 'label must be text' })
  @MinLength(1, { message: 'label must not be empty' })
  @MaxLength(80, { message: 'label must have at most 80 characters' })
  label: string;

  @IsNumber(FINITE, { message: 'hfeMin must be a number' })
  @Min(0, { message: 'hfeMin must not be negative' })
  hfeMin: number;

  @IsNumber(FINITE, { message: 'hfeMax must be a number' })
  @Min(0, { message: 'hfeMax must not be negative' })
  hfeMax: number;

  @IsOptional()
  @IsNumber(FINITE, { message: 'vbeMinMv must be a number (mV) or empty' })
  @Min(0, { message: 'vbeMinMv must not be negative' })
  @Max(5000, { message: 'vbeMinMv must be at most 5000 mV' })
  vbeMinMv?: number | null;

  @IsOptional()
  @IsNumber(FINITE, { message: 'vbeMaxMv must be a number (mV) or empty' })
  @Min(0, { message: 'vbeMaxMv must not be negative' })
  @Max(5000, { message: 'vbeMaxMv must be at most 5000 mV' })
  vbeMaxMv?: number | null;

  @IsOptional()
  @IsBoolean({ message: 'gapBeforeIntended must be true or false' })
  gapBeforeIntended?: boolean;
}

export class BinSchemeDto implements BinSchemeInput {
  @IsOptional()
  @TrimToNull()
  @IsString({ message: 'note must be text' })
  @MaxLength(300, { message: 'note must have at most 300 characters' })
  note?: string | null;

  @IsArray({ message: 'bins must be a list of bins' })
  @ArrayMinSize(1, { message: 'a scheme needs at least one bin' })
  @ArrayMaxSize(MAX_BINS, { message: `a scheme has at most ${MAX_BINS} bins` })
  @ValidateNested({ each: true })
  @Type(() => GainBinDto)
  bins: GainBinDto[];
}

const dotted = /bins\.(\d+)/g;

/**
 * Validates a scheme body. Field errors name a bin as `bins[i].field` (the generic validator
 * writes `bins.i.field`), the same names validateBinScheme's errors get.
 */
export async function parseBinSchemeBody(body: unknown): Promise<BinSchemeDto> {
  try {
    return await parseBody(BinSchemeDto, body);
  } catch (e) {
    if (!(e instanceof AppError) || !e.errors) throw e;
    throw new AppError(
      e.status,
      e.code,
      e.detail.replace(dotted, 'bins[$1]'),
      e.errors.map((f) => ({ field: f.field.replace(dotted, 'bins[$1]'), message: f.message.replace(dotted, 'bins[$1]') })),
    );
  }
}
