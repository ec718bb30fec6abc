import 'reflect-metadata';
import path from 'node:path';
import fs from 'node:fs';
import connectPgSimple from 'connect-pg-simple';
import express, { type Express } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import type { Transporter } from 'nodemailer';
import type { Pool } from 'pg';
import type { DataSource } from 'typeorm';
import { readConfig, type ServerConfig } from './config.ts';
import { csrfProtection } from './http/csrf.ts';
import { errorHandler, notFoundHandler } from './http/error-handler.ts';
import { requireAuth } from './http/guards.ts';
import { refuseUnstorableText } from './http/refuse-unstorable-text.ts';
import { cacheSessions, guardStoreErrors, throttleTouch } from './http/session-store.ts';
import { auditRouter } from './modules/audit/audit.routes.ts';
import { authRouter } from './modules/auth/auth.routes.ts';
import { createPassport } from './modules/auth/passport.ts';
import { activeUserCache } from './modules/users/active-user-cache.ts';
import { ReadingBatcher } from './modules/measurements/reading-batcher.ts';
import { headersSetBy, installReadingLane, readingLane } from './modules/measurements/reading-lane.ts';
import { createMailTransport } from './modules/mail/mail.service.ts';
import { mailRouter } from './modules/mail/mail.routes.ts';
import { healthRouter } from './modules/health/health.routes.ts';
import { usersRouter } from './modules/users/users.routes.ts';
import { partTypesRouter } from './modules/catalog/part-types.routes.ts';
import { suppliersRouter } from './modules/suppliers/suppliers.routes.ts';
import { labelsRouter } from './modules/labels/labels.routes.ts';
import { lotsRouter } from './modules/lots/lots.routes.ts';
import { settingsRouter } from './modules/settings/settings.routes.ts';
import { benchRouter } from './modules/bench/bench.routes.ts';
import { dispositionRouter } from './modules/disposition/disposition.routes.ts';
import { measurementsRouter } from './modules/measurements/measurements.routes.ts';
import { samplingRouter } from './modules/sampling/sampling.routes.ts';
import { binsRouter } from './modules/bins/bins.routes.ts';
import { supplierQualityRouter } from './modules/supplier-quality/supplier-quality.routes.ts';
import { pairingRouter } from './modules/pairing/pairing.routes.ts';
import { biasRouter } from './modules/bias/bias.routes.ts';

const SESSION_COOKIE = 'bw.sid';
const SESSION_MAX_AGE_MS = 12 * 60 * 60 * 1000;

export interface AppOptions {
  dataSource: DataSource;
  config?: ServerConfig;
  /** Folder of the built client (vite build); served with an SPA fallback when given. */
  clientDir?: string;
  /** SMTP transport for outgoing mail; built from config when absent. */
  mailTransport?: Transporter;
  /**
   * How long this process keeps a session row and a signed-in user after reading them (ms,
   * default 2 000; 0 reads both on every request). See docs/scaling.md for several instances.
   */
  authCacheMs?: number;
}

/** Builds the Express app: middleware, routers, error handler. Does not listen. */
export function createApp({ dataSource: ds, config = readConfig(), clientDir, mailTransport, authCacheMs = 2_000 }: AppOptions): Express {
  const transport = mailTransport ?? createMailTransport(config);
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  const securityHeaders = helmet({
    contentSecurityPolicy: {
      directives: {
        defaultSrc: ["'self'"],
        imgSrc: ["'self'", 'data:', 'blob:'],
        styleSrc: ["'self'", "'unsafe-inline'"],
        fontSrc: ["'self'", 'data:'],
        objectSrc: ["'none'"],
        frameSrc: ["'self'", 'blob:'],
        upgradeInsecureRequests: null,
      },
    },
  });

  const PgStore = connectPgSimple(session);
  const pool = (ds.driver as unknown as { master: Pool }).master;
  // The stored expiry is renewed at most once a minute per session (see throttleTouch); a
  // session read is kept for authCacheMs (see cacheSessions).
  const sessionStore = cacheSessions(
    throttleTouch(guardStoreErrors(new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60 })), 60_000),
    authCacheMs,
  );
  const users = activeUserCache(ds, authCacheMs);
  // Grid readings arriving together are written together (group commit, see reading-batcher.ts).
  const readings = new ReadingBatcher(ds);
  const jsonLimit = 1024 * 1024;
  // Grid readings of a signed-in inspector whose session and user are in memory skip Express and
  // the general stack below (reading-lane.ts, installReadingLane); every other request, and every
  // refusal, goes through it.
  // It sends the same security headers as helmet below (read from helmet once, headersSetBy).
  const lane = readingLane({
    cookie: { name: SESSION_COOKIE, secret: config.sessionSecret, maxAgeMs: SESSION_MAX_AGE_MS },
    sessions: sessionStore,
    users,
    readings,
    bodyLimit: jsonLimit,
    headers: headersSetBy(securityHeaders),
    trustProxy: app.get('trust proxy fn') as (address: string | undefined, hop: number) => boolean,
  });
  // Read by the tests (which path answered) and by nothing else.
  app.locals.readingLane = lane.stats;
  installReadingLane(app, lane);
  app.use(securityHeaders);

  const api = express.Router();
  api.use(express.json({ limit: jsonLimit }));
  api.use(refuseUnstorableText);
  // Before the session: health needs none, and answers its own 503 body when the database is down.
  api.use('/health', healthRouter(ds));
  api.use(
    session({
      name: SESSION_COOKIE,
      store: sessionStore,
      secret: config.sessionSecret,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      // secure 'auto': the cookie is marked Secure whenever the request came over HTTPS (directly or
      // from a TLS-terminating proxy on loopback, see trust proxy), and still works on plain HTTP.
      cookie: { httpOnly: true, sameSite: 'lax', secure: 'auto', maxAge: SESSION_MAX_AGE_MS },
    }),
  );
  const passport = createPassport(ds, { users });
  api.use(passport.initialize());
  api.use(passport.session());
  api.use(csrfProtection);

  api.use('/auth', authRouter(passport, { loginLimit: config.loginRateLimit }));
  api.use(requireAuth);
  api.use('/users', usersRouter(ds));
  api.use('/audit', auditRouter(ds));
  api.use('/part-types', partTypesRouter(ds));
  api.use('/suppliers', suppliersRouter(ds));
  api.use('/labels', labelsRouter(ds));
  // Bench: full paths (/sampling/plan, /lots/:id/summary, /switching/…, /bench/queue).
  api.use(samplingRouter(ds));
  api.use(measurementsRouter(ds, { readings }));
  api.use(dispositionRouter(ds));
  api.use(benchRouter(ds));
  // Bins: full paths (/containers…, /stock, /lots/:id/screening…, /labels/bins.pdf).
  api.use(binsRouter(ds));
  // Pairing: full paths (/pairing/preview, /pairing/stock, /kits…, /lots/:id/kits).
  api.use(pairingRouter(ds));
  // Fit-for-use: /bias/evaluate, /bias/fit-for-use, /bias/sources.
  api.use(biasRouter(ds));
  // Suppliers area: full paths (/scorecards…, /drift-alerts…, /ncrs…, /order-plans…).
  api.use(supplierQualityRouter(ds, { dataDir: config.dataDir, transport, from: config.smtp.from }));
  api.use('/lots', lotsRouter(ds, { dataDir: config.dataDir }));
  api.use('/settings', settingsRouter(ds));
  api.use('/mail', mailRouter(ds, config, transport));
  api.use(notFoundHandler);
  api.use(errorHandler);

  app.use('/api', api);

  if (clientDir && fs.existsSync(path.join(clientDir, 'index.html'))) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    // `root` keeps send's dot-file refusal off the client folder itself (e.g. .data/dist-…).
    app.get(/^(?!\/api\/).*/, (_req, res) => res.sendFile('index.html', { root: clientDir }));
  }
  app.use(errorHandler);
  return app;
}
