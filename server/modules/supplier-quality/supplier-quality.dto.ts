import { IsIn, IsInt, IsNumber, IsOptional, IsString, Matches, Max, MaxLength, Min, MinLength, ValidateIf } from 'class-validator';
import type { AcknowledgeAlertRequest, CloseNcrRequest, CreateNcrRequest, OrderPlanRequest, UpdateNcrRequest } from '../../../shared/api/supplier-quality.ts';
import { FINITE, OptionalNotNull, Rules, Trim, TrimToNull } from '../../http/dto-rules.ts';

const DATE = Rules(IsString({ message: 'dueDate must be a date YYYY-MM-DD' }), Matches(/^\d{4}-\d{2}-\d{2}$/, { message: 'dueDate must be a date YYYY-MM-DD' }));
const text = (field: string, min: number, max: number) =>
  Rules(
    Trim(),
    IsString({ message: `${field} must be text` }),
    MinLength(min, { message: `${field} must have at least ${min} characters` }),
    MaxLength(max, { message: `${field} must have at most ${max} characters` }),
  );

export class AcknowledgeAlertDto implements AcknowledgeAlertRequest {
  @text('note', 3, 1000) note: string;
}

export class CreateNcrDto implements CreateNcrRequest {
  @IsInt({ message: 'lotId must be a whole number' })
  @Min(1, { message: 'lotId must be a positive whole number' })
  lotId: number;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsInt({ message: 'alertId must be a whole number' })
  @Min(1, { message: 'alertId must be a positive whole number' })
  alertId?: number | null;

  @OptionalNotNull() @text('findings', 10, 6000) findings?: string;
  @OptionalNotNull() @text('disposition', 3, 1000) disposition?: string;
  @text('correctiveAction', 10, 2000) correctiveAction: string;
  @DATE dueDate: string;
}

export class UpdateNcrDto implements UpdateNcrRequest {
  @OptionalNotNull() @text('findings', 10, 6000) findings?: string;
  @OptionalNotNull() @text('disposition', 3, 1000) disposition?: string;
  @OptionalNotNull() @text('correctiveAction', 10, 2000) correctiveAction?: string;
  @OptionalNotNull() @DATE dueDate?: string;
}

export class CloseNcrDto implements CloseNcrRequest {
  @IsOptional()
  @TrimToNull()
  @IsString({ message: 'note must be text' })
  @MaxLength(1000, { message: 'note must have at most 1000 characters' })
  note?: string | null;
}

export class OrderPlanDto implements OrderPlanRequest {
  @IsInt({ message: 'supplierId must be a whole number' })
  @Min(1, { message: 'supplierId must be a positive whole number' })
  supplierId: number;

  @IsInt({ message: 'partTypeId must be a whole number' })
  @Min(1, { message: 'partTypeId must be a positive whole number' })
  partTypeId: number;

  @IsInt({ message: 'setsWanted must be a whole number' })
  @Min(1, { message: 'setsWanted must be at least 1' })
  @Max(1000, { message: 'setsWanted must be at most 1 000' })
  setsWanted: number;

  @IsIn([2, 4], { message: 'setSize must be 2 (pairs) or 4 (quads)' })
  setSize: 2 | 4;

  @IsNumber(FINITE, { message: 'hfeTolerancePct must be a number' })
  @Min(0.1, { message: 'hfeTolerancePct must be at least 0.1 %' })
  @Max(50, { message: 'hfeTolerancePct must be at most 50 %' })
  hfeTolerancePct: number;

  @IsNumber(FINITE, { message: 'vbeToleranceMv must be a number' })
  @Min(0.1, { message: 'vbeToleranceMv must be at least 0.1 mV' })
  @Max(200, { message: 'vbeToleranceMv must be at most 200 mV' })
  vbeToleranceMv: number;

  @IsNumber(FINITE, { message: 'confidencePct must be a number' })
  @Min(50, { message: 'confidencePct must be at least 50 %' })
  @Max(99.9, { message: 'confidencePct must be at most 99.9 %' })
  confidencePct: number;

  @IsOptional()
  @IsInt({ message: 'simulations must be a whole number' })
  @Min(20, { message: 'simulations must be at least 20' })
  @Max(1000, { message: 'simulations must be at most 1 000' })
  simulations?: number;

  @IsOptional()
  @IsInt({ message: 'seed must be a whole number' })
  @Min(0, { message: 'seed must be ≥ 0' })
  @Max(4294967295, { message: 'seed must fit in 32 bits' })
  seed?: number;
}
