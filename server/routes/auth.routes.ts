import { Router, type Request } from 'express';
import passport from 'passport';
import type { AppDeps } from '../deps';
import { parseInput } from '../lib/validate';
import { AppError, notFound } from '../lib/errors';
import { requireUser, type SessionUser } from '../auth/context';
import { signInLimits } from '../auth/sign-in-limits';
import { startSessionClock } from '../auth/session-lifetime';
import { toSessionUser } from '../auth/passport';
import {
  LoginInput, SwitchShopInput, ForgotPasswordInput, ResetPasswordInput, AcceptInvitationInput,
} from '@shared/schema/auth';
import {
  describeMe, requestPasswordReset, resetPassword, previewInvitation, acceptInvitation,
} from '../services/auth.service';
import { Membership } from '../models';

type TokenFn = (req: Request, overwrite?: boolean) => string;

function authenticate(req: Request): Promise<SessionUser | false> {
  return new Promise((resolve, reject) => {
    passport.authenticate('local', { session: false }, (err: unknown, user: SessionUser | false) =>
      err ? reject(err instanceof Error ? err : new Error(String(err))) : resolve(user),
    )(req);
  });
}

/** req.login regenerates the session (passport >= 0.6), so the pre-login cookie is dead after this. */
async function logIn(req: Request, user: SessionUser): Promise<void> {
  await new Promise<void>((resolve, reject) => req.login(user, (err) => (err ? reject(err instanceof Error ? err : new Error(String(err))) : resolve())));
  startSessionClock(req);
}

export function authRoutes(deps: AppDeps, csrfToken: TokenFn): Router {
  const r = Router();
  const limits = signInLimits(deps.sequelize, deps.config.LOGIN_RATE_LIMIT);

  r.get('/csrf', (req, res) => {
    res.json({ token: csrfToken(req) });
  });

  r.post('/login', async (req, res) => {
    const { email } = req.body = parseInput(LoginInput, req.body, 'The sign-in form');
    await limits.check(req, email);
    const user = await authenticate(req);
    if (!user) {
      await limits.failed(req, email);
      throw new AppError(401, 'bad_credentials', 'That e-mail and password do not match an account. Check both, or reset your password.');
    }
    await limits.succeeded(req, email);
    await logIn(req, user);
    const me = await describeMe(user, undefined);
    req.session.shopId = me.currentShopId ?? undefined;
    res.json({ ...me, csrfToken: csrfToken(req, true) });
  });

  r.post('/logout', async (req, res) => {
    await new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err instanceof Error ? err : new Error(String(err))) : resolve())));
    await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
    res.clearCookie('sw.sid');
    res.status(204).end();
  });

  r.get('/me', requireUser, async (req, res) => {
    const me = await describeMe(req.user!, req.session.shopId);
    req.session.shopId = me.currentShopId ?? undefined;
    res.json(me);
  });

  // What the app asks on every load: who is signed in, or { user: null }. Not being signed in is
  // an answer here, not an error, so the sign-in page logs no failed request. /me stays 401.
  r.get('/session', async (req, res) => {
    if (!req.user) {
      res.json({ user: null });
      return;
    }
    const me = await describeMe(req.user, req.session.shopId);
    req.session.shopId = me.currentShopId ?? undefined;
    res.json(me);
  });

  r.post('/shop', requireUser, async (req, res) => {
    const { shopId } = parseInput(SwitchShopInput, req.body);
    const membership = await Membership.findOne({ where: { shopId, userId: req.user!.id, disabledAt: null } });
    if (!membership) throw notFound('That shop');
    req.session.shopId = shopId;
    res.json(await describeMe(req.user!, shopId));
  });

  r.post('/password/forgot', async (req, res) => {
    const { email } = parseInput(ForgotPasswordInput, req.body);
    await limits.resetRequested(req, email);
    await requestPasswordReset(deps, email);
    res.status(202).json({ message: 'If that e-mail has an account, a reset link is on its way. It works once, for one hour.' });
  });

  r.post('/password/reset', async (req, res) => {
    const { token, password } = parseInput(ResetPasswordInput, req.body);
    await resetPassword(deps, token, password);
    res.status(204).end();
  });

  r.get('/invitations/:token', async (req, res) => {
    res.json(await previewInvitation(req.params.token));
  });

  r.post('/invitations/accept', async (req, res) => {
    const input = parseInput(AcceptInvitationInput, req.body, 'The invitation form');
    const user = await acceptInvitation(deps, input);
    await logIn(req, toSessionUser(user));
    const me = await describeMe(user, undefined);
    req.session.shopId = me.currentShopId ?? undefined;
    res.json({ ...me, csrfToken: csrfToken(req, true) });
  });
  return r;
}
