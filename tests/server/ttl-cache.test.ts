import type { SessionData, Store } from 'express-session';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cacheSessions } from '../../server/http/session-store.ts';
import { TtlCache } from '../../server/http/ttl-cache.ts';
import { FakeStore } from './fake-session-store.ts';

// Refresh ahead in the in-process caches of the hot path: an entry read after its refresh point
// (40–80 % of the TTL, drawn per entry) is loaded again in the background while the cached value
// is still answered. Pure unit tests: time is passed in or stubbed, Math.random is stubbed to pin
// the refresh point, and the reloads are promises the test settles itself.

interface Deferred<T> {
  promise: Promise<T>;
  resolve(value: T): void;
  reject(reason: unknown): void;
}

function deferred<T>(): Deferred<T> {
  let resolve!: (value: T) => void;
  let reject!: (reason: unknown) => void;
  const promise = new Promise<T>((res, rej) => {
    resolve = res;
    reject = rej;
  });
  return { promise, resolve, reject };
}

// Every test stubs the clock and the random draw (stubs below); each is undone after the test.
afterEach(() => vi.restoreAllMocks());

/** Lets the callbacks of settled promises run (the cache stores a reload's result in one). */
const settle = () => new Promise<void>((resolve) => setImmediate(resolve));

/**
 * A refresh function whose calls the test answers one by one: each call is recorded with its key
 * and returns a promise the test resolves or rejects.
 */
function controlledRefresh<V>() {
  const calls: { key: string; reload: Deferred<V | undefined> }[] = [];
  const refresh = (key: string) => {
    const reload = deferred<V | undefined>();
    calls.push({ key, reload });
    return reload.promise;
  };
  return { calls, refresh };
}

/**
 * Stubs Date.now (a reload stores its result at Date.now(), not at a time the test passes) and
 * Math.random (the draw of the refresh point). `at(t)` moves the clock and returns t, so the same
 * time can be passed to get/set explicitly. Undone after each test (afterEach above).
 */
function stubs(start: number, random: number) {
  const now = vi.spyOn(Date, 'now').mockReturnValue(start);
  const rand = vi.spyOn(Math, 'random').mockReturnValue(random);
  return {
    rand,
    at(t: number) {
      now.mockReturnValue(t);
      return t;
    },
  };
}

/** A refreshing cache holding 'k' = 'old' since T0, with the clock stubbed (random picks the refresh point). */
function cacheWithOldEntry(random: number) {
  const s = stubs(T0, random);
  const { calls, refresh } = controlledRefresh<string>();
  const cache = new TtlCache<string, string>(TTL, 100, refresh);
  cache.set('k', 'old', cache.ticket('k'), s.at(T0));
  return { s, calls, cache };
}

const T0 = 1_000_000;
const TTL = 1_000;

describe('TtlCache refresh ahead', () => {
  it('a read before the refresh point reloads nothing; the first read at it starts one reload and still answers the cached value', async () => {
    const { s, calls, cache } = cacheWithOldEntry(0); // random 0: the refresh point is 40 % of the TTL
    expect(cache.get('k', s.at(T0 + 399))).toBe('old');
    expect(calls).toHaveLength(0);
    expect(cache.get('k', s.at(T0 + 400))).toBe('old');
    expect(calls.map((c) => c.key)).toEqual(['k']);
    // While that reload is pending, reads keep answering the cached value and start no other.
    expect(cache.get('k', s.at(T0 + 500))).toBe('old');
    expect(cache.get('k', s.at(T0 + 900))).toBe('old');
    expect(calls).toHaveLength(1);
    await settle();
    expect(cache.get('k', s.at(T0 + 950))).toBe('old');
    expect(calls).toHaveLength(1);
  });

  it('with random 1 the refresh point is 80 % of the TTL', () => {
    const { s, calls, cache } = cacheWithOldEntry(1);
    expect(cache.get('k', s.at(T0 + 799))).toBe('old');
    expect(calls).toHaveLength(0);
    expect(cache.get('k', s.at(T0 + 800))).toBe('old');
    expect(calls).toHaveLength(1);
  });

  it('the reloaded value replaces the entry with a TTL counted from the reload, and gets its own refresh point', async () => {
    const { s, calls, cache } = cacheWithOldEntry(0);
    expect(cache.get('k', s.at(T0 + 400))).toBe('old');
    s.at(T0 + 500);
    calls[0].reload.resolve('new');
    await settle();
    // The new value is answered, and past the old entry's expiry (T0 + 1000) too: it lives
    // until T0 + 500 + TTL.
    expect(cache.get('k', s.at(T0 + 600))).toBe('new');
    expect(calls).toHaveLength(1); // the new entry's refresh point is T0 + 500 + 400
    expect(cache.get('k', s.at(T0 + 899))).toBe('new');
    expect(calls).toHaveLength(1);
    expect(cache.get('k', s.at(T0 + 900))).toBe('new');
    expect(calls).toHaveLength(2); // a second reload, from the new entry's refresh point
    expect(cache.get('k', s.at(T0 + 1_000))).toBe('new');
    expect(cache.get('k', s.at(T0 + 1_499))).toBe('new');
    // Never older than the TTL: with the second reload still pending, the entry expires.
    expect(cache.get('k', s.at(T0 + 1_500))).toBeUndefined();
  });

  it('a reload that finds nothing (signed out, deactivated) drops the entry at once', async () => {
    const { s, calls, cache } = cacheWithOldEntry(0);
    expect(cache.get('k', s.at(T0 + 400))).toBe('old');
    calls[0].reload.resolve(undefined);
    await settle();
    // Well within the old entry's TTL, yet gone.
    expect(cache.get('k', s.at(T0 + 401))).toBeUndefined();
  });

  it('a failed reload leaves the entry to expire at its TTL, without another reload on each read', async () => {
    const { s, calls, cache } = cacheWithOldEntry(0);
    expect(cache.get('k', s.at(T0 + 400))).toBe('old');
    calls[0].reload.reject(new Error('database down'));
    await settle();
    expect(cache.get('k', s.at(T0 + 500))).toBe('old');
    expect(cache.get('k', s.at(T0 + 999))).toBe('old');
    expect(calls).toHaveLength(1);
    expect(cache.get('k', s.at(T0 + 1_000))).toBeUndefined();
  });

  it('an invalidation after a reload started wins: the reload result is not stored, and a "nothing" result does not drop a newer entry', async () => {
    const s = stubs(T0, 0);
    const { calls, refresh } = controlledRefresh<string>();
    const cache = new TtlCache<string, string>(TTL, 100, refresh);
    cache.set('a', 'old', cache.ticket('a'), s.at(T0));
    cache.set('b', 'old', cache.ticket('b'), s.at(T0));
    expect(cache.get('a', s.at(T0 + 400))).toBe('old');
    expect(cache.get('b', s.at(T0 + 400))).toBe('old');
    expect(calls.map((c) => c.key)).toEqual(['a', 'b']);

    // a: invalidated (say, signed out) while its reload ran; the reload then brings the row
    // as it was read before the write. Storing it would put the old value back for a TTL.
    cache.invalidate('a');
    calls[0].reload.resolve('stale');
    await settle();
    expect(cache.get('a', s.at(T0 + 500))).toBeUndefined();

    // b: invalidated and loaded again by a request (new ticket) while its reload ran; the
    // reload then finds nothing. That older answer must not drop the newer entry.
    cache.invalidate('b');
    cache.set('b', 'fresh', cache.ticket('b'), s.at(T0 + 450));
    calls[1].reload.resolve(undefined);
    await settle();
    expect(cache.get('b', s.at(T0 + 500))).toBe('fresh');
  });

  it('entries set at the same time with different draws are refreshed at different times (the jitter)', () => {
    const s = stubs(T0, 0);
    s.rand.mockReturnValueOnce(0).mockReturnValueOnce(1);
    const { calls, refresh } = controlledRefresh<string>();
    const cache = new TtlCache<string, string>(TTL, 100, refresh);
    cache.set('early', 'e', cache.ticket('early'), s.at(T0)); // refresh point T0 + 400
    cache.set('late', 'l', cache.ticket('late'), s.at(T0)); // refresh point T0 + 800
    const readBoth = (t: number) => {
      expect(cache.get('early', s.at(t))).toBe('e');
      expect(cache.get('late', s.at(t))).toBe('l');
    };
    readBoth(T0 + 400);
    expect(calls.map((c) => c.key)).toEqual(['early']);
    readBoth(T0 + 799);
    expect(calls.map((c) => c.key)).toEqual(['early']);
    readBoth(T0 + 800);
    expect(calls.map((c) => c.key)).toEqual(['early', 'late']);
  });

  it('without a refresh function an entry is answered as stored until its TTL, then is gone (nothing reloads it)', () => {
    const s = stubs(T0, 0);
    const cache = new TtlCache<string, { v: number }>(TTL, 100);
    const value = { v: 1 };
    cache.set('k', value, cache.ticket('k'), s.at(T0));
    expect(cache.get('k', s.at(T0 + 400))).toBe(value);
    expect(cache.get('k', s.at(T0 + 999))).toBe(value);
    expect(cache.get('k', s.at(T0 + 1_000))).toBeUndefined();
  });
});


describe('cacheSessions refresh ahead', () => {
  const TTL_S = 2_000; // with random 0 the refresh point is 800 ms after a load
  const sessionOf = (csrfToken: string, userId?: number): SessionData =>
    ({
      csrfToken,
      ...(userId === undefined ? {} : { passport: { user: userId } }),
      cookie: { originalMaxAge: 3_600_000, expires: new Date(T0 + 3_600_000), httpOnly: true, path: '/' },
    }) as unknown as SessionData;
  /** store.get as a promise, and whether its callback ran before get returned (from memory). */
  const read = (store: Store, sid: string) => {
    let sync = true;
    let inMemory = false;
    const answer = new Promise<SessionData | null | undefined>((resolve, reject) =>
      store.get(sid, (err, sess) => {
        inMemory = sync;
        if (err) reject(err as Error);
        else resolve(sess);
      }),
    );
    sync = false;
    return answer.then((sess) => ({ sess, inMemory }));
  };

  it('a read after the refresh point is answered from memory while the store is read once in the background; later reads get the new data', async () => {
    const s = stubs(T0, 0);
    const inner = new FakeStore();
    inner.sessions.set('a', sessionOf('t1'));
    const store = cacheSessions(inner, TTL_S);
    expect((await read(store, 'a')).sess?.csrfToken).toBe('t1');
    expect(inner.gets).toBe(1);
    s.at(T0 + 799);
    expect(await read(store, 'a')).toMatchObject({ sess: { csrfToken: 't1' }, inMemory: true });
    expect(inner.gets).toBe(1);

    // The row changes behind the cache's back (another instance issued a new token).
    inner.sessions.set('a', sessionOf('t2'));
    inner.holdGets = true;
    s.at(T0 + 800);
    expect(await read(store, 'a')).toMatchObject({ sess: { csrfToken: 't1' }, inMemory: true });
    expect(inner.gets).toBe(2);
    // More reads while the background load is pending: still from memory, no second load.
    s.at(T0 + 900);
    expect(await read(store, 'a')).toMatchObject({ sess: { csrfToken: 't1' }, inMemory: true });
    expect(inner.gets).toBe(2);

    inner.held.shift()!();
    await settle();
    s.at(T0 + 1_000);
    expect(await read(store, 'a')).toMatchObject({ sess: { csrfToken: 't2' }, inMemory: true });
    // Past the first load's TTL (T0 + 2000) the refreshed entry is still answered from memory.
    s.at(T0 + 2_500);
    expect(await read(store, 'a')).toMatchObject({ sess: { csrfToken: 't2' }, inMemory: true });
  });

  it('a session destroyed in the store behind the cache (sign-out through another instance) is dropped by the refresh', async () => {
    const s = stubs(T0, 0);
    const inner = new FakeStore();
    inner.sessions.set('a', sessionOf('t1', 7));
    const store = cacheSessions(inner, TTL_S);
    await read(store, 'a');
    inner.sessions.delete('a');
    inner.holdGets = true;
    s.at(T0 + 800);
    expect(await read(store, 'a')).toMatchObject({ sess: { csrfToken: 't1' }, inMemory: true });
    // Until the background load answers, the cached session is still the one given out.
    expect(store.glance('a', T0 + 800)).toEqual({ userId: 7, csrfToken: 't1', secureCookie: false });
    expect(inner.gets).toBe(2);
    inner.holdGets = false;
    inner.held.shift()!();
    await settle();
    // Well within the TTL, the entry is gone: the reading lane falls back to the full path,
    // and the next read asks the store, which has no such session.
    expect(store.glance('a', s.at(T0 + 801))).toBeUndefined();
    expect((await read(store, 'a')).sess).toBeNull();
    expect(inner.gets).toBe(3);
  });

  it('glance(sid) past the refresh point also starts the background load, and answers the cached values meanwhile', async () => {
    const s = stubs(T0, 0);
    const inner = new FakeStore();
    inner.sessions.set('a', sessionOf('t1', 7));
    const store = cacheSessions(inner, TTL_S);
    await read(store, 'a');
    inner.sessions.set('a', sessionOf('t2', 7));
    expect(store.glance('a', s.at(T0 + 799))).toEqual({ userId: 7, csrfToken: 't1', secureCookie: false });
    expect(inner.gets).toBe(1);
    expect(store.glance('a', s.at(T0 + 800))).toEqual({ userId: 7, csrfToken: 't1', secureCookie: false });
    expect(inner.gets).toBe(2);
    await settle();
    expect(store.glance('a', s.at(T0 + 900))).toEqual({ userId: 7, csrfToken: 't2', secureCookie: false });
    expect(inner.gets).toBe(2);
  });
});
