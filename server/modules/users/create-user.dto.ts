import { IsEmail, IsIn, IsString, MaxLength, MinLength, Validate } from 'class-validator';
import { ROLES, type Role } from '../../../shared/api/roles.ts';
import type { CreateUserRequest } from '../../../shared/api/users.ts';
import { PasswordRules } from './password-rules.ts';

export class CreateUserDto implements CreateUserRequest {
  @IsEmail({}, { message: 'email must be an e-mail address' })
  @MaxLength(254)
  email: string;

  @IsString()
  @MinLength(2, { message: 'name must have at least 2 characters' })
  @MaxLength(120)
  name: string;

  @IsIn(ROLES as unknown as Role[], { message: `role must be one of ${ROLES.join(', ')}` })
  role: Role;

  @IsString()
  @MinLength(10, { message: 'password must have at least 10 characters' })
  @MaxLength(200)
  @Validate(PasswordRules)
  password: string;
}
