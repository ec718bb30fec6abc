import { Type } from 'class-transformer';
import { IsIn, IsInt, IsOptional, IsString, Matches, MaxLength, Min, MinLength, ValidateIf, ValidateNested } from 'class-validator';
import type { CurrentUnit, ImportFields, ImportMapping, ImportUnits, VoltageUnit } from '../../../shared/api/measurements.ts';

export class ImportMappingDto implements ImportMapping {
  @IsString({ message: 'map a column to position' })
  @MinLength(1, { message: 'map a column to position' })
  @MaxLength(120)
  position: string;

  @IsString({ message: 'map a column to hfe' })
  @MinLength(1, { message: 'map a column to hfe' })
  @MaxLength(120)
  hfe: string;

  @IsString({ message: 'map a column to vbe' })
  @MinLength(1, { message: 'map a column to vbe' })
  @MaxLength(120)
  vbe: string;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @MaxLength(120)
  vceSat?: string | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @MaxLength(120)
  leakage?: string | null;
}

export class ImportUnitsDto implements ImportUnits {
  @IsIn(['mV', 'V'], { message: 'units.vbe must be mV or V' })
  vbe: VoltageUnit;

  @IsIn(['mV', 'V'], { message: 'units.vceSat must be mV or V' })
  vceSat: VoltageUnit;

  @IsIn(['nA', 'uA'], { message: 'units.leakage must be nA or uA' })
  leakage: CurrentUnit;
}

export class ImportFieldsDto implements ImportFields {
  @IsInt({ message: 'sessionId must be a whole number' })
  @Min(1)
  sessionId: number;

  @ValidateNested()
  @Type(() => ImportMappingDto)
  mapping: ImportMappingDto;

  @ValidateNested()
  @Type(() => ImportUnitsDto)
  units: ImportUnitsDto;

  @IsOptional()
  @IsString()
  @Matches(/^[A-Za-z0-9-]{8,64}$/, { message: 'progressToken must be 8–64 letters, digits or dashes' })
  progressToken?: string;
}
