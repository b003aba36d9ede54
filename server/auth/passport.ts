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
  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: string, done) => {
    User.findByPk(id)
      .then((user) => done(null, user ? toSessionUser(user) : false))
      .catch(done);
  });
}

export function toSessionUser(user: User): SessionUser {
  return { id: user.id, email: user.email, name: user.name };
}
