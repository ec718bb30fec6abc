import type { Role } from './roles.ts';

export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: Role;
}

export interface LoginRequest {
  email: string;
  password: string;
}

export interface LoginResponse {
  user: SessionUser;
}

export interface CsrfResponse {
  csrfToken: string;
}
