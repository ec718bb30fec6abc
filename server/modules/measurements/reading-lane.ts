import { createHmac, timingSafeEqual } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import type { TLSSocket } from 'node:tls';
import type { Express, Request, RequestHandler, Response } from 'express';
import type { SessionData, Store } from 'express-session';
import type { SessionUser } from '../../../shared/api/auth.ts';
import { AppError } from '../../http/app-error.ts';
import { rolesAllowedFor } from '../../http/guards.ts';
import type { CachedSessionStore } from '../../http/session-store.ts';
import type { TtlCache } from '../../http/ttl-cache.ts';
import { parseBody } from '../../http/validate.ts';
import { plainReading, RecordMeasurementDto } from './measurements.dto.ts';
import type { ReadingBatcher } from './reading-batcher.ts';

export interface ReadingLaneOptions {
  /** The session cookie as express-session sets it (see app.ts). */
  cookie: { name: string; secret: string; maxAgeMs: number };
  /** The app's session store (cacheSessions over throttleTouch, see session-store.ts). */
  sessions: Store & CachedSessionStore;
  /** The signed-in users passport reloads each request (the same cache). */
  users: TtlCache<number, SessionUser>;
  readings: ReadingBatcher;
  /** Largest JSON body, bytes (express.json's limit in app.ts). */
  bodyLimit: number;
  /** Headers every answer carries (the security headers, see headersSetBy). */
  headers: [string, string | string[]][];
  /** The app's compiled `trust proxy` setting (`app.get('trust proxy fn')`), for the cookie's Secure flag. */
  trustProxy: (address: string | undefined, hop: number) => boolean;
}

/**
 * The headers a middleware that only sets headers (helmet with fixed options) sets on an answer,
 * read once by running it on a stand-in answer. Throws if it does more than set and remove
 * headers, or does not call next at once — then its headers cannot be copied.
 */
export function headersSetBy(middleware: RequestHandler): [string, string | string[]][] {
  const set = new Map<string, [string, string | string[]]>();
  const stand = {
    setHeader(name: string, value: string | number | string[]) {
      set.set(name.toLowerCase(), [name, Array.isArray(value) ? value.map(String) : String(value)]);
      return stand;
    },
    removeHeader(name: string) {
      set.delete(name.toLowerCase());
    },
    getHeader(name: string) {
      return set.get(name.toLowerCase())?.[1];
    },
  };
  let called = false;
  middleware({ method: 'GET', url: '/', headers: {} } as Request, stand as unknown as Response, (err?: unknown) => {
    if (err) throw err instanceof Error ? err : new Error(String(err));
    called = true;
  });
  if (!called) throw new Error('headersSetBy: the middleware did not call next at once');
  return [...set.values()];
}

/**
 * Whether Express would call this request secure (req.secure): its protocol is https, read from
 * the socket or, when the peer is a trusted proxy, from X-Forwarded-Proto (first value) —
 * Express's own rule (req.protocol), for a request that has not been through Express.
 */
export function isSecure(req: IncomingMessage, trustProxy: ReadingLaneOptions['trustProxy']): boolean {
  const own = (req.socket as TLSSocket).encrypted ? 'https' : 'http';
  if (!trustProxy(req.socket.remoteAddress, 0)) return own === 'https';
  const header = req.headers['x-forwarded-proto'];
  const value = (Array.isArray(header) ? header[0] : header) || own;
  const comma = value.indexOf(',');
  return (comma !== -1 ? value.slice(0, comma) : value).trim() === 'https';
}

const PATH = /^\/api\/lots\/([1-9]\d{0,14})\/measurements$/;
const JSON_TYPE = /^application\/json\s*(;\s*charset="?utf-8"?\s*)?$/i;

/**
 * The reading lane: POST /api/lots/:id/measurements answered without the general middleware
 * stack, when — and only when — everything that stack would look up is already in this
 * process's memory: a session cookie with a valid signature, that session in the session cache
 * (cacheSessions), the CSRF token of that session in the x-csrf-token header, the signed-in user
 * in the user cache, and a role that may record (rolesAllowedFor('inspector'), as the route's
 * guard). Anything else — no cookie, a session or user not cached, a wrong token or role, a
 * body that is not plain UTF-8 JSON with a Content-Length within the limit, a query string — is
 * passed on untouched to the full path (express-session, passport, CSRF check, the route in
 * measurements.routes.ts), which answers it as before; so every refusal (401, 403, CSRF) comes
 * from the one place that also serves every other route.
 *
 * Once the lane takes a request it does what the route does: the same DTO validation
 * (parseBody), the same group commit (ReadingBatcher.record), the same answers; errors go to the
 * app's error handler, so they are the same problem+json. Like express-session with `rolling`,
 * it renews the session cookie on the answer and touches the stored session (throttled).
 *
 * Why: at 1 000 readings a second one Node process spent ~0.9 ms of CPU per reading, most of it
 * in the general stack (router walk over every mounted route, session load and hashing, passport,
 * body parsing); see docs/benchmarks.md, "Load".
 */
/** How many requests the lane answered (taken) and passed on to the full path (POST readings only). */
export interface ReadingLaneStats {
  taken: number;
  passed: number;
}

/**
 * The lane's signature: Node's own request and answer (it runs before Express, see
 * installReadingLane); `next()` hands the request to Express untouched, `next(err)` to Express
 * with the error, for the app's error handler to answer.
 */
export type ReadingLane = ((req: IncomingMessage, res: ServerResponse, next: (err?: unknown) => void) => void) & { stats: ReadingLaneStats };

export function readingLane(o: ReadingLaneOptions): ReadingLane {
  const stats: ReadingLaneStats = { taken: 0, passed: 0 };
  const allowed = rolesAllowedFor('inspector');
  const { name, secret, maxAgeMs } = o.cookie;
  const cookieRe = new RegExp(`(?:^|;\\s*)${name.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}=([^;]*)`);
  /**
   * Signed cookie value (as sent) → session id and the value as express-session writes it
   * (URI-encoded), for values whose signature was checked.
   */
  const verified = new Map<string, { sid: string; encoded: string }>();

  const sessionOf = (sent: string): { sid: string; encoded: string } | null => {
    const seen = verified.get(sent);
    if (seen !== undefined) return seen;
    let value: string;
    try {
      value = decodeURIComponent(sent);
    } catch {
      return null;
    }
    if (!value.startsWith('s:')) return null;
    const signed = value.slice(2);
    const dot = signed.lastIndexOf('.');
    if (dot < 1) return null;
    const sid = signed.slice(0, dot);
    // cookie-signature's format, as express-session signs: sid + '.' + base64 HMAC-SHA256 without padding.
    const expected = Buffer.from(`${sid}.${createHmac('sha256', secret).update(sid).digest('base64').replace(/=+$/, '')}`);
    const got = Buffer.from(signed);
    if (expected.length !== got.length || !timingSafeEqual(expected, got)) return null;
    if (verified.size >= 10_000) verified.clear();
    const known = { sid, encoded: encodeURIComponent(value) };
    verified.set(sent, known);
    return known;
  };

  const lane = (req: IncomingMessage, res: ServerResponse, next: (err?: unknown) => void): void => {
    if (req.method !== 'POST') return next();
    const m = PATH.exec(req.url ?? '');
    if (!m) return next();
    const passOn = () => {
      stats.passed++;
      next();
    };
    const h = req.headers;
    const type = h['content-type'];
    const length = Number(h['content-length']);
    if (!type || !JSON_TYPE.test(type) || h['content-encoding'] || !(length >= 0 && length <= o.bodyLimit) || h['transfer-encoding']) return passOn();
    const cookieHeader = h.cookie;
    const sent = cookieHeader ? cookieRe.exec(cookieHeader)?.[1] : undefined;
    if (!sent) return passOn();
    const signed = sessionOf(sent);
    if (!signed) return passOn();
    const { sid } = signed;
    const now = Date.now();
    const glance = o.sessions.glance(sid, now);
    if (!glance || glance.userId === null || !glance.csrfToken) return passOn();
    const token = h['x-csrf-token'];
    if (typeof token !== 'string' || token.length !== glance.csrfToken.length || !timingSafeEqual(Buffer.from(token), Buffer.from(glance.csrfToken))) return passOn();
    const user = o.users.get(glance.userId, now);
    if (!user || !allowed.has(user.role)) return passOn();

    // Taken: from here on this request is answered here (or by the app's error handler).
    stats.taken++;
    for (const [k, v] of o.headers) res.setHeader(k, v);
    const expires = new Date(now + maxAgeMs);
    const secure = glance.secureCookie;
    // As express-session: the cookie keeps the Secure flag the session was created with, and a
    // Secure cookie is not sent back over plain HTTP (issecure: a TLS socket, or Express's req.secure).
    if (!secure || (req.socket as TLSSocket).encrypted || isSecure(req, o.trustProxy)) {
      res.setHeader('Set-Cookie', `${name}=${signed.encoded}; Path=/; Expires=${expires.toUTCString()}; HttpOnly${secure ? '; Secure' : ''}; SameSite=Lax`);
    }
    o.sessions.touch?.(sid, { cookie: { originalMaxAge: maxAgeMs, expires, httpOnly: true, path: '/', secure, sameSite: 'lax' } } as unknown as SessionData, () => {});
    const lotId = Number(m[1]);
    const chunks: Buffer[] = [];
    let size = 0;
    let failed = false;
    const fail = (err: unknown) => {
      if (failed) return;
      failed = true;
      // Never "no error": the body is read, so Express must answer with the error handler.
      next(err ?? new Error('The reading failed without a reason.'));
    };
    req.on('data', (c: Buffer) => {
      size += c.length;
      if (size > length) {
        req.pause();
        fail(new AppError(413, 'too-large', 'The request body is larger than its Content-Length.'));
        return;
      }
      chunks.push(c);
    });
    req.on('error', fail);
    req.on('end', () => {
      if (failed) return;
      let text = (chunks.length === 1 ? chunks[0] : Buffer.concat(chunks)).toString('utf8');
      // express.json drops a leading byte-order mark; so does the lane.
      if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
      let body: unknown = {};
      if (text.trim() !== '') {
        const first = text.trimStart()[0];
        // express.json is strict: only an object or an array is JSON for it.
        if (first !== '{' && first !== '[') return fail(new AppError(400, 'invalid-json', 'The request body is not valid JSON.'));
        try {
          body = JSON.parse(text);
        } catch {
          return fail(new AppError(400, 'invalid-json', 'The request body is not valid JSON.'));
        }
      }
      // A plainly valid reading skips class-validator; anything else gets its field errors from parseBody.
      const plain = plainReading(body);
      (plain ? Promise.resolve(plain) : parseBody(RecordMeasurementDto, body))
        .then((input) => o.readings.record(user, lotId, input))
        .then((row) => {
          const json = JSON.stringify(row);
          res.statusCode = 201;
          res.setHeader('Content-Type', 'application/json; charset=utf-8');
          res.setHeader('Content-Length', Buffer.byteLength(json));
          res.end(json);
        }, fail);
    });
  };
  return Object.assign(lane, { stats });
}

const LANE_ERROR = Symbol('reading lane error');

/**
 * Puts the lane in front of Express: every request reaches the lane first; what it passes on
 * goes to Express as if the lane were not there, and an error it met goes to Express to be
 * answered by the app's error handler (the first middleware, laneErrors, hands it on).
 *
 * In front of Express rather than as its first middleware because Express changes the
 * prototype of every request and answer it handles (Object.setPrototypeOf in app.handle). In a
 * small server under the load bench's paced load, doing just that made ~1.3 MB of requests
 * survive each young-generation collection (Node's HTTP server alone: none); in the bench the
 * server copied ≈ 16 kB a reading to the old generation, ≈ 6 kB with the lane in front (and
 * ~0.1 kB once V8's pretenuring was off too, see server/gc-tuning.ts), and its CPU per reading at
 * saturation fell from 0.35 to 0.2 ms (docs/scaling.md, "Third round").
 */
export function installReadingLane(app: Express, lane: ReadingLane): void {
  type Handle = (req: IncomingMessage, res: ServerResponse, callback?: (err?: unknown) => void) => void;
  const inner = app as unknown as { handle: Handle };
  const handle = inner.handle.bind(app);
  inner.handle = (req, res, callback) =>
    lane(req, res, (err) => {
      if (err !== undefined) (req as unknown as Record<symbol, unknown>)[LANE_ERROR] = err;
      handle(req, res, callback);
    });
  app.use(laneErrors);
}

/** The app's first middleware: an error the lane met goes on to the error handler. */
const laneErrors: RequestHandler = (req, _res, next) => {
  const err = (req as unknown as Record<symbol, unknown>)[LANE_ERROR];
  if (err === undefined) next();
  else next(err);
};
