import type { Store } from 'express-session';

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
