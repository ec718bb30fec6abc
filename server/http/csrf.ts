import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, RequestHandler } from 'express';
import { AppError } from './app-error.ts';

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string;
  }
}

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Synchronizer token kept in the session; created on demand by GET /api/auth/csrf. */
export function issueCsrfToken(req: Request): string {
  if (!req.session.csrfToken) req.session.csrfToken = randomBytes(32).toString('base64url');
  return req.session.csrfToken;
}

export const csrfProtection: RequestHandler = (req, _res, next) => {
  if (SAFE.has(req.method)) return next();
  const expected = req.session?.csrfToken;
  const sent = req.get('x-csrf-token');
  if (!expected || !sent) {
    return next(new AppError(403, 'csrf', 'Missing CSRF token: fetch GET /api/auth/csrf and send it in the x-csrf-token header.'));
  }
  const a = Buffer.from(expected);
  const b = Buffer.from(sent);
  if (a.length !== b.length || !timingSafeEqual(a, b)) {
    return next(new AppError(403, 'csrf', 'The CSRF token does not match this session. Reload the page and try again.'));
  }
  next();
};
