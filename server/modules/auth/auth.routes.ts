import { Router, type Request } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { Passport } from 'passport';
import type { SessionUser } from '../../../shared/api/auth.ts';
import { AppError } from '../../http/app-error.ts';
import { sendProblem } from '../../http/error-handler.ts';
import { issueCsrfToken } from '../../http/csrf.ts';
import { parseBody } from '../../http/validate.ts';
import { LoginDto } from './login.dto.ts';

function logIn(req: Request, user: SessionUser): Promise<void> {
  // passport 0.7 regenerates the session on login; keep the CSRF token the client already holds.
  const token = req.session.csrfToken;
  return new Promise((resolve, reject) =>
    req.login(user, (err) => {
      if (err) return reject(err);
      req.session.csrfToken = token;
      resolve();
    }),
  );
}

export function authRouter(passport: InstanceType<typeof Passport>, opts: { loginLimit: number }): Router {
  const r = Router();

  const loginLimiter = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: opts.loginLimit,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${String((req.body as { email?: unknown })?.email ?? '').toLowerCase()}`,
    handler: (_req, res) =>
      sendProblem(res, 429, 'too-many-attempts', 'Too many failed sign-ins for this e-mail. Wait 15 minutes and try again.'),
  });

  // Password spraying (one guess each for many e-mails) passes the per-e-mail limit: failures
  // from one address are limited too, at ten times the per-e-mail count.
  const addressLimiter = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: opts.loginLimit * 10,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? ''),
    handler: (_req, res) =>
      sendProblem(res, 429, 'too-many-attempts', 'Too many failed sign-ins from this address. Wait 15 minutes and try again.'),
  });

  r.get('/csrf', (req, res, next) => {
    const csrfToken = issueCsrfToken(req);
    // Saved before answering: a token the store could not keep is an error (503 when the
    // database is down), not a 200 carrying a token that no later request will match.
    req.session.save((err) => (err ? next(err) : res.json({ csrfToken })));
  });

  r.post('/login', addressLimiter, loginLimiter, async (req, res, next) => {
    await parseBody(LoginDto, req.body);
    passport.authenticate('local', { session: false }, (err: unknown, user: SessionUser | false) => {
      if (err) return next(err);
      if (!user) return next(AppError.unauthorized('The e-mail or password is not right.'));
      logIn(req, user).then(() => res.json({ user }), next);
    })(req, res, next);
  });

  r.get('/me', (req, res) => {
    if (!req.user) throw AppError.unauthorized();
    res.json({ user: req.user });
  });

  r.post('/logout', (req, res, next) => {
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy((err2) => {
        if (err2) return next(err2);
        res.clearCookie('bw.sid');
        res.status(204).end();
      });
    });
  });

  return r;
}
