import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { User } from '../models';
import { loadActor, type Actor } from '../policies/actor';
import { verifyPassword } from './passwords';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace -- Express declares its request types in this global namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type -- declaration merging: req.user is our Actor
    interface User extends Actor {}
  }
}

let configured = false;

/** passport-local on e-mail and password; the session keeps only the user id. */
export function configurePassport() {
  if (configured) return passport;
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, async (email, password, done) => {
      try {
        const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
        const ok = await verifyPassword(user?.active ? user.passwordHash : null, password);
        if (!user || !ok) return done(null, false);
        return done(null, (await loadActor(user.id)) ?? false);
      } catch (err) {
        return done(err);
      }
    }),
  );
  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser(async (id: number, done) => {
    try {
      // A deactivated person's session ends at once: no actor, no user.
      done(null, (await loadActor(id)) ?? false);
    } catch (err) {
      done(err);
    }
  });
  configured = true;
  return passport;
}
