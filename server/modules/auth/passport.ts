import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { DataSource } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { TtlCache } from '../../http/ttl-cache.ts';
import { activeUserCache } from '../users/active-user-cache.ts';
import { authenticate, findActiveUser } from '../users/users.service.ts';

/**
 * One Passport instance per app. The session holds only the user id; each request reloads the
 * user, from a cache of `userCacheMs` (a change through this process is seen at once, see
 * active-user-cache.ts; 0 turns the cache off), or from the given cache (`users`, shared with the
 * reading lane).
 */
export function createPassport(ds: DataSource, opts: { userCacheMs?: number; users?: TtlCache<number, SessionUser> } = {}): InstanceType<typeof Passport> {
  const users = opts.users ?? activeUserCache(ds, opts.userCacheMs ?? 0);
  const passport = new Passport();
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      authenticate(ds, email, password).then(
        (user) => done(null, user ?? false),
        (err) => done(err),
      );
    }),
  );
  passport.serializeUser((user, done) => done(null, (user as SessionUser).id));
  passport.deserializeUser((id: number, done) => {
    const hit = users.get(id);
    if (hit) return done(null, hit);
    const ticket = users.ticket(id);
    findActiveUser(ds, id).then(
      (user) => {
        if (user) users.set(id, user, ticket);
        done(null, user ?? false);
      },
      (err) => done(err),
    );
  });
  return passport;
}
