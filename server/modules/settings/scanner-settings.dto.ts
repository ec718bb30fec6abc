import { ArrayMaxSize, IsArray, IsOptional, IsString, MaxLength, MinLength } from 'class-validator';
import type { ScannerSettings } from '../../../shared/api/settings.ts';

const LIST = { message: '$property must be a list of at most 10 substitutes' };
const ITEM = { each: true, message: 'each substitute must be text of 1 to 12 characters' };

export class ScannerSettingsDto implements ScannerSettings {
  @IsArray(LIST)
  @ArrayMaxSize(10, LIST)
  @IsString(ITEM)
  @MinLength(1, ITEM)
  @MaxLength(12, ITEM)
  gs: string[];

  @IsArray(LIST)
  @ArrayMaxSize(10, LIST)
  @IsString(ITEM)
  @MinLength(1, ITEM)
  @MaxLength(12, ITEM)
  rs: string[];

  @IsArray(LIST)
  @ArrayMaxSize(10, LIST)
  @IsString(ITEM)
  @MinLength(1, ITEM)
  @MaxLength(12, ITEM)
  eot: string[];

  @IsOptional()
  @IsString({ message: 'purchaseOrderPattern must be a regular expression as text, or null' })
  @MaxLength(200)
  purchaseOrderPattern: string | null;
}
