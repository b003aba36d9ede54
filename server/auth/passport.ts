import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { User } from '../models';
import { checkPassword, DUMMY_HASH } from '../lib/passwords';
import type { SessionUser } from './context';

let configured = false;

/** E-mail and password; an unknown e-mail and a wrong password fail the same way, in the same time. */
export function configurePassport(): void {
  if (configured) return;
  configured = true;
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      User.findOne({ where: { email: email.trim().toLowerCase() } })
        .then(async (user) => {
          const ok = await checkPassword(password, user?.passwordHash ?? DUMMY_HASH);
          done(null, user && ok ? toSessionUser(user) : false);
        })
        .catch(done);
    }),
  );
  // The session keeps who signed in (id, e-mail, name), so a request costs no user lookup; the
  // roles are read fresh from the membership on every request, so a change applies at once.
  passport.serializeUser((user, done) => done(null, { id: user.id, email: user.email, name: user.name }));
  passport.deserializeUser((stored: SessionUser | string, done) => {
    if (typeof stored === 'object' && stored && typeof stored.id === 'string') return done(null, stored);
    done(null, false);
  });
}

export function toSessionUser(user: User): SessionUser {
  return { id: user.id, email: user.email, name: user.name };
}
