import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { User } from '../models';
import type { PasswordHasher } from '../services/passwords';

/** Why a sign-in did not produce a session; the controller turns it into an answer. */
export type SignInRefusal = 'mismatch' | 'pending' | 'disabled';

/**
 * A passport instance of our own (not the global singleton), so several apps can live in
 * one test process. Sessions hold only the user id; each request reloads the account so a
 * disabled account loses access at once.
 */
export function createPassport(hasher: PasswordHasher) {
  const passport = new Passport();

  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, async (email, password, done) => {
      try {
        const user = await User.findOne({ where: { email: email.toLowerCase() } });
        const matches = user ? await hasher.verify(password, user.passwordHash) : await hasher.verifyAgainstNothing(password);
        if (!user || !matches) return done(null, false, { message: 'mismatch' satisfies SignInRefusal });
        // Status is only revealed to someone who knows the password.
        if (user.status === 'pending') return done(null, false, { message: 'pending' satisfies SignInRefusal });
        if (user.status !== 'active') return done(null, false, { message: 'disabled' satisfies SignInRefusal });
        return done(null, user);
      } catch (error) {
        return done(error);
      }
    }),
  );

  passport.serializeUser<number>((user, done) => done(null, (user as User).id));
  passport.deserializeUser<number>(async (id, done) => {
    try {
      const user = await User.findByPk(id);
      // An account switched off since sign-in is treated as signed out.
      done(null, user && user.status === 'active' ? user : false);
    } catch (error) {
      done(error);
    }
  });

  return passport;
}
export type AppPassport = ReturnType<typeof createPassport>;
