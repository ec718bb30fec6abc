import type { DataSource } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import { TtlCache } from '../../http/ttl-cache.ts';
import { findActiveUser } from './users.service.ts';

/**
 * The signed-in users each request reloads (passport's deserializeUser), kept for a short time
 * per app. Keyed by DataSource, so users.service can forget a user it changed (role, name,
 * deactivation) in every app of this process that reads the same database. Another instance
 * sees the change within its TTL (docs/scaling.md).
 */
const caches = new WeakMap<DataSource, Set<TtlCache<number, SessionUser>>>();

export function activeUserCache(ds: DataSource, ttlMs: number): TtlCache<number, SessionUser> {
  // Refreshed ahead while in use (see TtlCache); a user no longer active drops out.
  const cache = new TtlCache<number, SessionUser>(ttlMs, 20_000, (id) => findActiveUser(ds, id).then((u) => u ?? undefined));
  let set = caches.get(ds);
  if (!set) caches.set(ds, (set = new Set()));
  set.add(cache);
  return cache;
}

/** Called after a change of the user's row has committed. */
export function forgetCachedUser(ds: DataSource, id: number): void {
  for (const c of caches.get(ds) ?? []) c.invalidate(id);
}
