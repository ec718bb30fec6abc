import { Type } from 'class-transformer';
import { IsIn, IsInt, IsISO8601, IsOptional, IsString, Matches, Max, MaxLength, Min, MinLength, ValidateNested } from 'class-validator';
import { DRY_BAG_STATES, LOT_MSL_VALUES, type CreateLotRequest, type DryBagState } from '../../../shared/api/lots.ts';

export class LotOverrideDto {
  @IsString({ message: 'override.reason must be text' })
  @MinLength(10, { message: 'override.reason must say why, in at least 10 characters' })
  @MaxLength(500)
  reason: string;
}

export class CreateLotDto implements CreateLotRequest {
  @IsInt({ message: 'supplierId must be the id of a supplier' })
  @Min(1, { message: 'supplierId must be the id of a supplier' })
  supplierId: number;

  @IsInt({ message: 'partTypeId must be the id of a part type' })
  @Min(1, { message: 'partTypeId must be the id of a part type' })
  partTypeId: number;

  @IsInt({ message: 'quantity must be a whole number of parts' })
  @Min(1, { message: 'quantity must be at least 1' })
  @Max(100_000_000, { message: 'quantity must be at most 100 000 000' })
  quantity: number;

  @IsOptional()
  @IsString()
  @MaxLength(60, { message: 'purchaseOrder must be at most 60 characters' })
  purchaseOrder?: string | null;

  @IsOptional()
  @IsString()
  @MaxLength(60, { message: 'supplierPartNumber must be at most 60 characters' })
  supplierPartNumber?: string | null;

  @IsOptional()
  @IsString()
  @MaxLength(60, { message: 'supplierLot must be at most 60 characters' })
  supplierLot?: string | null;

  @IsOptional()
  @IsString()
  @MaxLength(20, { message: 'dateCode must be at most 20 characters' })
  dateCode?: string | null;

  @IsOptional()
  @IsString()
  @Matches(/^([A-Za-z]{2})?$/, { message: 'countryOfOrigin must be an ISO 3166 two-letter code, e.g. MY' })
  countryOfOrigin?: string | null;

  @IsOptional()
  @IsIn(LOT_MSL_VALUES as unknown as string[], { message: `msl must be one of ${LOT_MSL_VALUES.join(', ')}` })
  msl?: string | null;

  @IsIn(DRY_BAG_STATES as unknown as string[], { message: `dryBag must be one of ${DRY_BAG_STATES.join(', ')}` })
  dryBag: DryBagState;

  @IsOptional()
  @IsISO8601({ strict: true }, { message: 'bagOpenedAt must be an ISO 8601 date and time' })
  bagOpenedAt?: string | null;

  @IsOptional()
  @IsString()
  @MaxLength(4000, { message: 'labelText must be at most 4000 characters' })
  labelText?: string | null;

  @IsOptional()
  @ValidateNested()
  @Type(() => LotOverrideDto)
  override?: LotOverrideDto | null;
}
