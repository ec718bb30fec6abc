import type { RequestHandler } from 'express';
import type { SessionUser } from '../../shared/api/auth.ts';
import type { Role } from '../../shared/api/roles.ts';
import { AppError } from './app-error.ts';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}

export const requireAuth: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(AppError.unauthorized());
  next();
};

/** The roles a route for `roles` admits: the quality engineer passes wherever an inspector does. */
export function rolesAllowedFor(...roles: Role[]): ReadonlySet<Role> {
  const allowed = new Set<Role>(roles);
  if (allowed.has('inspector')) allowed.add('quality');
  return allowed;
}

/** Allows only the listed roles (see rolesAllowedFor). */
export function requireRole(...roles: Role[]): RequestHandler {
  const allowed = rolesAllowedFor(...roles);
  const guard: RequestHandler & { allowedRoles?: ReadonlySet<Role> } = (req, _res, next) => {
    if (!req.user) return next(AppError.unauthorized());
    if (!allowed.has(req.user.role)) {
      return next(AppError.forbidden(`This needs the role ${[...allowed].join(' or ')}; you are signed in as ${req.user.role}.`));
    }
    next();
  };
  // Read by the route × role matrix test, which walks the router to find every guard.
  guard.allowedRoles = allowed;
  return guard;
}

export function currentUser(req: Express.Request): SessionUser {
  if (!req.user) throw AppError.unauthorized();
  return req.user;
}
