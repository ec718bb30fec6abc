import { Store, type SessionData } from 'express-session';

/**
 * An in-memory express-session store for the session-store wrapper tests (hot-path.test.ts,
 * ttl-cache.test.ts): counts reads and touches, can fail reads, and can hold a read's answer
 * until the test releases it (the row as it was when the read started, as a query's snapshot).
 */
export class FakeStore extends Store {
  touches = 0;
  gets = 0;
  getError: unknown = null;
  sessions = new Map<string, SessionData>();
  /** When set, get() answers only when the test calls the function it pushed to `held`. */
  holdGets = false;
  held: (() => void)[] = [];
  get(sid: string, cb: (err: unknown, session?: SessionData | null) => void) {
    this.gets++;
    const s = this.sessions.get(sid) ?? null;
    const answer = () => cb(this.getError, s && (JSON.parse(JSON.stringify(s)) as SessionData));
    if (this.holdGets) this.held.push(answer);
    else answer();
  }
  set(sid: string, s: SessionData, cb?: (err?: unknown) => void) {
    this.sessions.set(sid, s);
    cb?.();
  }
  destroy(sid: string, cb?: (err?: unknown) => void) {
    this.sessions.delete(sid);
    cb?.();
  }
  touch(_sid: string, _s: SessionData, cb?: (err?: unknown) => void) {
    this.touches++;
    cb?.();
  }
}
