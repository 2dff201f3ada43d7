import passport, { type PassportStatic } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { DataSource } from 'typeorm';
import { passwordMatches } from './password-hash';
import { User } from './user.entity';
import { toSessionUser } from './user.mapper';

/** Why a sign-in was refused; the controller turns it into a specific message. */
export type SignInRefusal = 'bad_credentials' | 'account_inactive';

/**
 * A passport instance of our own (not the global singleton), so each app made
 * by `createApp()` — one per test file, say — has its own strategies.
 */
export function createPassport(ds: DataSource): PassportStatic {
  const instance = new passport.Passport() as PassportStatic;
  const users = ds.getRepository(User);

  instance.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      (async () => {
        const user = await users.findOneBy({ email: email.trim().toLowerCase() });
        // Check the password before the account state, so only its owner learns an account is inactive.
        if (!(await passwordMatches(user?.passwordHash ?? null, password)) || !user) {
          return done(null, false, { message: 'bad_credentials' satisfies SignInRefusal });
        }
        if (!user.active) return done(null, false, { message: 'account_inactive' satisfies SignInRefusal });
        return done(null, toSessionUser(user));
      })().catch(done);
    }),
  );

  instance.serializeUser((user, done) => done(null, user.id));
  // Reload on every request so a deactivated or demoted account takes effect at once.
  instance.deserializeUser((id: string, done) => {
    users
      .findOneBy({ id })
      .then((user) => done(null, user?.active ? toSessionUser(user) : false))
      .catch(done);
  });
  return instance;
}
