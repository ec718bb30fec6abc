import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsIn,
  IsInt,
  IsNumber,
  IsOptional,
  IsString,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateBy,
  ValidateNested,
} from 'class-validator';
import { POLARITIES, type Polarity } from '../../../shared/api/catalog.ts';
import {
  MATCH_MODES,
  SET_SIZES,
  type CancelKitRequest,
  type CreateKitRequest,
  type KitPlanRequest,
  type MatchMode,
  type PairingPreviewRequest,
  type PreviewPart,
  type PullKitPartRequest,
  type SetSize,
} from '../../../shared/api/pairing.ts';
import { MAX_HOLD_MINUTES, MIN_HOLD_MINUTES } from '../../../shared/domain/kitting/index.ts';
import { AppError } from '../../http/app-error.ts';
import { FINITE, Trim } from '../../http/dto-rules.ts';
import { parseBody } from '../../http/validate.ts';

/** Most parts one preview may carry (loose parts measured by hand). */
export const MAX_PREVIEW_PARTS = 5000;
/** Widest tolerances accepted: 100 % hFE, 100 mV Vbe. */
const MAX_HFE_TOL = 100;
const MAX_VBE_TOL = 100;

/** A part id for the preview: text of 1–40 characters or a whole number. */
const IsPartId = (): PropertyDecorator =>
  ValidateBy({
    name: 'isPartId',
    validator: {
      validate: (v: unknown) => (typeof v === 'string' && v.trim().length > 0 && v.length <= 40) || (typeof v === 'number' && Number.isSafeInteger(v)),
      defaultMessage: () => 'id must be text (1–40 characters) or a whole number',
    },
  });

export class PreviewPartDto implements PreviewPart {
  @IsPartId()
  id: string | number;

  @IsIn(POLARITIES as unknown as Polarity[], { message: `polarity must be one of ${POLARITIES.join(', ')}` })
  polarity: Polarity;

  @IsNumber(FINITE, { message: 'hfe must be a number' })
  @Min(0.001, { message: 'hfe must be greater than 0' })
  @Max(100000, { message: 'hfe must be at most 100 000' })
  hfe: number;

  @IsNumber(FINITE, { message: 'vbeMv must be a number (mV)' })
  @Min(-5000, { message: 'vbeMv must be at least −5000 mV' })
  @Max(5000, { message: 'vbeMv must be at most 5000 mV' })
  vbeMv: number;
}

class TolerancesDto {
  @IsNumber(FINITE, { message: 'hfeTolerancePct must be a number (%)' })
  @Min(0, { message: 'hfeTolerancePct must not be negative' })
  @Max(MAX_HFE_TOL, { message: `hfeTolerancePct must be at most ${MAX_HFE_TOL} %` })
  hfeTolerancePct: number;

  @IsNumber(FINITE, { message: 'vbeToleranceMv must be a number (mV)' })
  @Min(0, { message: 'vbeToleranceMv must not be negative' })
  @Max(MAX_VBE_TOL, { message: `vbeToleranceMv must be at most ${MAX_VBE_TOL} mV` })
  vbeToleranceMv: number;
}

export class PairingPreviewDto extends TolerancesDto implements PairingPreviewRequest {
  @IsArray({ message: 'parts must be a list of parts' })
  @ArrayMaxSize(MAX_PREVIEW_PARTS, { message: `at most ${MAX_PREVIEW_PARTS} parts per preview` })
  @ValidateNested({ each: true })
  @Type(() => PreviewPartDto)
  parts: PreviewPartDto[];

  @IsIn(SET_SIZES as unknown as SetSize[], { message: 'setSize must be 2 (pairs) or 4 (quads)' })
  setSize: SetSize;

  @IsIn(MATCH_MODES as unknown as MatchMode[], { message: `mode must be one of ${MATCH_MODES.join(', ')}` })
  mode: MatchMode;
}

export class KitPlanDto implements KitPlanRequest {
  @IsInt({ message: 'partTypeId must be a whole number' })
  @Min(1, { message: 'partTypeId must be 1 or more' })
  partTypeId: number;

  @IsOptional()
  @IsInt({ message: 'complementPartTypeId must be a whole number' })
  @Min(1, { message: 'complementPartTypeId must be 1 or more' })
  complementPartTypeId?: number;

  @IsIn(MATCH_MODES as unknown as MatchMode[], { message: `mode must be one of ${MATCH_MODES.join(', ')}` })
  mode: MatchMode;

  @IsIn(SET_SIZES as unknown as SetSize[], { message: 'setSize must be 2 (pairs) or 4 (quads)' })
  setSize: SetSize;

  @IsInt({ message: 'setsWanted must be a whole number' })
  @Min(1, { message: 'setsWanted must be 1 or more' })
  @Max(500, { message: 'setsWanted must be at most 500' })
  setsWanted: number;

  @IsOptional()
  @IsNumber(FINITE, { message: 'hfeTolerancePct must be a number (%)' })
  @Min(0, { message: 'hfeTolerancePct must not be negative' })
  @Max(MAX_HFE_TOL, { message: `hfeTolerancePct must be at most ${MAX_HFE_TOL} %` })
  hfeTolerancePct?: number;

  @IsOptional()
  @IsNumber(FINITE, { message: 'vbeToleranceMv must be a number (mV)' })
  @Min(0, { message: 'vbeToleranceMv must not be negative' })
  @Max(MAX_VBE_TOL, { message: `vbeToleranceMv must be at most ${MAX_VBE_TOL} mV` })
  vbeToleranceMv?: number;
}

export class CreateKitDto extends KitPlanDto implements CreateKitRequest {
  @IsOptional()
  @IsInt({ message: 'holdMinutes must be a whole number of minutes' })
  @Min(MIN_HOLD_MINUTES, { message: `holdMinutes must be at least ${MIN_HOLD_MINUTES}` })
  @Max(MAX_HOLD_MINUTES, { message: `holdMinutes must be at most ${MAX_HOLD_MINUTES} (7 days)` })
  holdMinutes?: number;

  @IsOptional()
  @Trim()
  @IsString({ message: 'note must be text' })
  @MaxLength(300, { message: 'note must have at most 300 characters' })
  note?: string;
}

export class PullKitPartDto implements PullKitPartRequest {
  @Trim()
  @IsString({ message: 'containerCode must be text' })
  @MinLength(1, { message: 'containerCode must not be empty: scan the container label' })
  @MaxLength(60, { message: 'containerCode must be at most 60 characters' })
  containerCode: string;

  @IsInt({ message: 'position must be a whole number' })
  @Min(1, { message: 'position must be 1 or more' })
  @Max(100000, { message: 'position must be at most 100 000' })
  position: number;
}

export class CancelKitDto implements CancelKitRequest {
  @IsOptional()
  @Trim()
  @IsString({ message: 'reason must be text' })
  @MaxLength(300, { message: 'reason must have at most 300 characters' })
  reason?: string;
}

const dotted = /parts\.(\d+)/g;

/** Validates a preview body; field errors name a part as `parts[i].field`, as the matching domain does. */
export async function parsePreviewBody(body: unknown): Promise<PairingPreviewDto> {
  try {
    const dto = await parseBody(PairingPreviewDto, body);
    if (dto.parts.some((p) => p === null || typeof p !== 'object')) throw AppError.badRequest('Check parts.', [{ field: 'parts', message: 'each part must be an object' }]);
    return dto;
  } catch (e) {
    if (!(e instanceof AppError) || !e.errors) throw e;
    throw new AppError(e.status, e.code, e.detail.replace(dotted, 'parts[$1]'), e.errors.map((f) => ({ ...f, field: f.field.replace(dotted, 'parts[$1]') })));
  }
}
