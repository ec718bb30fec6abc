import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { DataSource } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import { authenticate, findActiveUser } from '../users/users.service.ts';

/** One Passport instance per app. The session holds only the user id; each request reloads the user. */
export function createPassport(ds: DataSource): InstanceType<typeof Passport> {
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
    findActiveUser(ds, id).then(
      (user) => done(null, user ?? false),
      (err) => done(err),
    );
  });
  return passport;
}
