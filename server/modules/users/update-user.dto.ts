import { IsBoolean, IsIn, IsOptional, IsString, MaxLength, MinLength } from 'class-validator';
import { ROLES, type Role } from '../../../shared/api/roles.ts';
import type { UpdateUserRequest } from '../../../shared/api/users.ts';

export class UpdateUserDto implements UpdateUserRequest {
  @IsOptional()
  @IsString()
  @MinLength(2, { message: 'name must have at least 2 characters' })
  @MaxLength(120)
  name?: string;

  @IsOptional()
  @IsIn(ROLES as unknown as Role[], { message: `role must be one of ${ROLES.join(', ')}` })
  role?: Role;

  @IsOptional()
  @IsBoolean({ message: 'active must be true or false' })
  active?: boolean;
}
