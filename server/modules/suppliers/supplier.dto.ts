import { IsEmail, IsIn, IsInt, IsOptional, IsString, Matches, MaxLength, Min, MinLength } from 'class-validator';
import {
  APPROVAL_STATUSES,
  type ApprovalStatus,
  type ContactInput,
  type ContactUpdate,
  type SupplierInput,
  type SupplierPartInput,
  type SupplierUpdate,
} from '../../../shared/api/catalog.ts';
import { OptionalNotNull, Rules, Trim, TrimToNull } from '../../http/dto-rules.ts';

const text = (field: string, min: number, max: number) =>
  Rules(
    Trim(),
    IsString({ message: `${field} must be text` }),
    MinLength(min, { message: min === 1 ? `${field} must not be empty` : `${field} must have at least ${min} characters` }),
    MaxLength(max, { message: `${field} must have at most ${max} characters` }),
  );

const optionalText = (field: string, max: number) =>
  Rules(IsOptional(), TrimToNull(), IsString({ message: `${field} must be text` }), MaxLength(max, { message: `${field} must have at most ${max} characters` }));

const S = {
  code: Rules(
    text('code', 2, 20),
    Matches(/^[A-Za-z0-9][A-Za-z0-9_-]*$/, { message: 'code may hold letters, digits, - and _ only, without spaces' }),
  ),
  name: text('name', 2, 120),
  approval: IsIn(APPROVAL_STATUSES as unknown as string[], { message: `approval must be one of ${APPROVAL_STATUSES.join(', ')}` }),
  notes: optionalText('notes', 1000),
};

export class CreateSupplierDto implements SupplierInput {
  @S.code code: string;
  @S.name name: string;
  @OptionalNotNull() @S.approval approval?: ApprovalStatus;
  @S.notes notes?: string | null;
}

export class UpdateSupplierDto implements SupplierUpdate {
  @OptionalNotNull() @S.code code?: string;
  @OptionalNotNull() @S.name name?: string;
  @OptionalNotNull() @S.approval approval?: ApprovalStatus;
  @S.notes notes?: string | null;
  @OptionalNotNull() @text('approvalReason', 3, 400) approvalReason?: string;
}

const C = {
  name: text('name', 2, 120),
  email: Rules(
    Trim(),
    IsEmail({}, { message: 'email must be an e-mail address' }),
    MaxLength(254, { message: 'email must have at most 254 characters' }),
  ),
  phone: Rules(
    optionalText('phone', 40),
    Matches(/^[0-9+()./ -]*$/, { message: 'phone may hold digits, spaces and + ( ) . / - only' }),
  ),
  duty: optionalText('duty', 40),
};

export class ContactDto implements ContactInput {
  @C.name name: string;
  @C.email email: string;
  @C.phone phone?: string | null;
  @C.duty duty?: string | null;
}

export class UpdateContactDto implements ContactUpdate {
  @OptionalNotNull() @C.name name?: string;
  @OptionalNotNull() @C.email email?: string;
  @C.phone phone?: string | null;
  @C.duty duty?: string | null;
}

export class SupplierPartDto implements SupplierPartInput {
  @text('supplierPartNumber', 1, 60) supplierPartNumber: string;

  @IsInt({ message: 'partTypeId must be a whole number' })
  @Min(1, { message: 'partTypeId must be a positive whole number' })
  partTypeId: number;
}
