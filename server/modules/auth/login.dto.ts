import { IsEmail, IsString, MaxLength, MinLength } from 'class-validator';
import type { LoginRequest } from '../../../shared/api/auth.ts';

export class LoginDto implements LoginRequest {
  @IsEmail({}, { message: 'email must be an e-mail address' })
  @MaxLength(254)
  email: string;

  @IsString({ message: 'password is required' })
  @MinLength(1, { message: 'password is required' })
  @MaxLength(200)
  password: string;
}
