import type { SessionData, Store } from 'express-session';
import { databaseUnavailable, isDatabaseUnavailable } from './database-errors.ts';
import { TtlCache } from './ttl-cache.ts';

/**
 * Turns the store's connection errors into the 503 "database unavailable" problem. Without it a
 * stopped PostgreSQL reached through its Unix socket fails with ENOENT, which express-session
 * takes for "no such session" — the user would be shown as signed out instead of being told
 * the database is down.
 */
export function guardStoreErrors<S extends Store>(store: S): S {
  const wrap = (err: unknown) => (err && isDatabaseUnavailable(err) ? databaseUnavailable() : err);
  const get = store.get.bind(store);
  store.get = (sid, callback) => get(sid, (err, session) => callback(wrap(err), session));
  const set = store.set.bind(store);
  store.set = (sid, session, callback) => set(sid, session, (err) => callback?.(wrap(err)));
  const destroy = store.destroy.bind(store);
  store.destroy = (sid, callback) => destroy(sid, (err) => callback?.(wrap(err)));
  if (store.touch) {
    const touch = store.touch.bind(store);
    // The typings give touch's callback no error argument; express-session does pass one on.
    type ErrCallback = (err?: unknown) => void;
    store.touch = (sid, session, callback) => touch(sid, session, ((err?: unknown) => (callback as ErrCallback | undefined)?.(wrap(err))) as () => void);
  }
  return store;
}

/**
 * Limits the session store's `touch` to one per session per `intervalMs`. connect-pg-simple
 * touches with an UPDATE of the session row on every request, and express-session holds the
 * answer until that UPDATE is done: one extra write and one extra round trip per request. The
 * stored expiry then lags the rolling cookie by at most the interval (a minute of a 12-hour
 * session). Each server instance keeps its own memory of touches; with several instances a
 * session is touched at most once per interval by each.
 */
export function throttleTouch<S extends Store>(store: S, intervalMs: number, maxTracked = 50_000): S {
  const touch = store.touch?.bind(store);
  if (!touch) return store;
  const last = new Map<string, number>();
  store.touch = (sid, session, callback) => {
    const now = Date.now();
    const at = last.get(sid);
    if (at !== undefined && now - at < intervalMs) {
      callback?.();
      return;
    }
    if (last.size >= maxTracked) {
      for (const [k, t] of last) if (now - t >= intervalMs) last.delete(k);
      if (last.size >= maxTracked) last.clear();
    }
    last.set(sid, now);
    touch(sid, session, callback);
  };
  return store;
}

/** What the reading lane (server/modules/measurements/reading-lane.ts) needs of a cached session. */
export interface SessionGlance {
  /** passport's user id, when signed in. */
  userId: number | null;
  csrfToken: string | null;
  /**
   * The stored cookie's Secure flag. express-session decides 'auto' once, when it creates the
   * session, and keeps it for the session's life; a Secure session's cookie is only sent back
   * over HTTPS.
   */
  secureCookie: boolean;
}

export interface CachedSessionStore {
  /**
   * The session `sid` as this process holds it in memory, without reading the store: undefined
   * when it is not held, or held past its TTL or past its cookie's expiry. Never reads the
   * database, so a caller must fall back to the full path (express-session) on undefined.
   */
  glance(sid: string, now?: number): SessionGlance | undefined;
}

interface CachedSession {
  json: string;
  glance: SessionGlance;
  /** The stored cookie's expiry (ms since the epoch), or null when it has none. */
  expiresAt: number | null;
}

function cachedSession(sess: SessionData): CachedSession {
  const data = sess as SessionData & { passport?: { user?: unknown } };
  const user = data.passport?.user;
  const expires = sess.cookie?.expires;
  return {
    json: JSON.stringify(sess),
    glance: {
      userId: typeof user === 'number' ? user : null,
      csrfToken: typeof data.csrfToken === 'string' ? data.csrfToken : null,
      secureCookie: sess.cookie?.secure === true,
    },
    expiresAt: expires ? new Date(expires).getTime() : null,
  };
}

/**
 * Keeps each session read from the store for `ttlMs` in this process, so most requests of a
 * signed-in user do not read the session row from PostgreSQL. Writes through this process (a
 * new CSRF token, sign-in, sign-out) invalidate the entry at once; a sign-out through another
 * instance takes effect here within `ttlMs` (docs/scaling.md). The session is kept as its JSON
 * text and parsed per request, because express-session changes the object it is given. A
 * cached session past its cookie's expiry is read again (the store then answers "none").
 */
export function cacheSessions<S extends Store>(store: S, ttlMs: number): S & CachedSessionStore {
  const get = store.get.bind(store);
  const load = (sid: string) =>
    new Promise<CachedSession | undefined>((resolve, reject) => get(sid, (err, sess) => (err ? reject(err as Error) : resolve(sess ? cachedSession(sess) : undefined))));
  const cache = new TtlCache<string, CachedSession>(ttlMs, 20_000, load);
  const fresh = (sid: string, now: number): CachedSession | undefined => {
    const hit = cache.get(sid, now);
    if (!hit) return undefined;
    if (hit.expiresAt === null || hit.expiresAt > now) return hit;
    cache.invalidate(sid);
    return undefined;
  };
  const cached = store as S & CachedSessionStore;
  cached.glance = (sid, now = Date.now()) => (ttlMs > 0 ? fresh(sid, now)?.glance : undefined);
  if (ttlMs <= 0) return cached;
  store.get = (sid, callback) => {
    const hit = fresh(sid, Date.now());
    if (hit) {
      callback(null, JSON.parse(hit.json) as SessionData);
      return;
    }
    const ticket = cache.ticket(sid);
    get(sid, (err, sess) => {
      if (!err && sess) cache.set(sid, cachedSession(sess), ticket);
      callback(err, sess);
    });
  };
  const set = store.set.bind(store);
  store.set = (sid, sess, callback) => {
    cache.invalidate(sid);
    set(sid, sess, (err) => {
      cache.invalidate(sid);
      callback?.(err);
    });
  };
  const destroy = store.destroy.bind(store);
  store.destroy = (sid, callback) => {
    cache.invalidate(sid);
    destroy(sid, (err) => {
      cache.invalidate(sid);
      callback?.(err);
    });
  };
  return cached;
}
