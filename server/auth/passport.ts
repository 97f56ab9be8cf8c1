// passport-local: e-mail + password against bcrypt hashes; the session holds only the user id.
// An inactive user cannot sign in, and a session whose user was deactivated stops working at once.
import passportModule from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { Shop, User } from '../models';
import { verifyPassword } from './passwords';

/** The signed-in user attached to req.user (a User with its shop loaded). */
export type SessionUser = User & { shop: Shop };

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}

/** Builds a Passport instance (not the global one, so several apps can live in one test process). */
export function createPassport(bcryptRounds: number): passportModule.Authenticator {
  const passport = new passportModule.Passport();
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      User.findOne({ where: { email: email.trim().toLowerCase() }, include: [{ model: Shop, as: 'shop' }] })
        .then(async (user) => {
          const ok = await verifyPassword(password, user?.passwordHash ?? null, bcryptRounds);
          if (!user || !ok) return done(null, false);
          // Only someone who knows the password learns that the account is deactivated.
          if (!user.active) return done(null, false, { message: 'deactivated' });
          return done(null, user as SessionUser);
        })
        .catch(done);
    }),
  );
  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: number, done) => {
    User.findOne({ where: { id, active: true }, include: [{ model: Shop, as: 'shop' }] })
      .then((user) => done(null, (user as SessionUser | null) ?? false))
      .catch(done);
  });
  return passport;
}
