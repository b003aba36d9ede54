import { Op } from 'sequelize';
import type { AppDeps } from '../deps';
import { Membership, PasswordReset, Shop, User, Invitation } from '../models';
import { hashToken, newLinkToken } from '../lib/tokens';
import { hashPassword, checkPassword } from '../lib/passwords';
import { AppError } from '../lib/errors';
import type { Me } from '@shared/schema/auth';
import type { AcceptInvitationInput } from '@shared/schema/auth';
import { audit } from './audit';
import { forgetSessionsOf } from '../auth/session-store';
import { forgetMembership } from '../auth/context';

export const RESET_LINK_MINUTES = 60;

export async function describeMe(user: { id: string; email: string; name: string }, currentShopId: string | undefined): Promise<Me> {
  const memberships = await Membership.findAll({
    where: { userId: user.id, disabledAt: null },
    include: [{ model: Shop, as: 'shop', attributes: ['id', 'name', 'locale'] }],
    order: [['createdAt', 'ASC']],
  });
  const shops = memberships.map((m) => {
    const shop = (m as Membership & { shop: Shop }).shop;
    return { id: shop.id, name: shop.name, roles: m.roles, locale: shop.locale ?? null };
  });
  const current = shops.find((s) => s.id === currentShopId)?.id ?? shops[0]?.id ?? null;
  return { user: { id: user.id, email: user.email, name: user.name }, shops, currentShopId: current };
}

/** Always succeeds from the caller's view, so the answer does not reveal who has an account. */
export async function requestPasswordReset(deps: AppDeps, email: string): Promise<void> {
  const user = await User.findOne({ where: { email } });
  if (!user) return;
  const token = newLinkToken();
  await PasswordReset.create({
    userId: user.id, tokenHash: token.hash, usedAt: null,
    expiresAt: new Date(Date.now() + RESET_LINK_MINUTES * 60_000),
  });
  const link = `${deps.config.appUrl}/reset-password?token=${token.raw}`;
  await deps.mailer.send({
    to: user.email,
    subject: 'Reset your Sparkwright password',
    text: `Hello ${user.name},\n\nSomeone (we hope you) asked to reset your Sparkwright password.\n` +
      `Open this link within ${RESET_LINK_MINUTES} minutes to choose a new one; it works once:\n\n${link}\n\n` +
      `If you did not ask for this, ignore this e-mail: your password stays as it is.\n`,
  });
  await audit({ shopId: null, userId: user.id, action: 'password.reset_requested', entity: 'user', entityId: user.id });
}

export async function resetPassword(deps: AppDeps, raw: string, password: string): Promise<void> {
  const userId = await deps.sequelize.transaction(async (transaction) => {
    const reset = await PasswordReset.findOne({ where: { tokenHash: hashToken(raw) }, transaction, lock: true });
    if (!reset || reset.usedAt || reset.expiresAt.getTime() < Date.now()) {
      throw new AppError(410, 'link_expired', 'This reset link has expired or was already used. Ask for a new one from the sign-in page.');
    }
    await User.update({ passwordHash: await hashPassword(password) }, { where: { id: reset.userId }, transaction });
    await reset.update({ usedAt: new Date() }, { transaction });
    // any other open links for the same person stop working too
    await PasswordReset.update({ usedAt: new Date() }, { where: { userId: reset.userId, usedAt: null }, transaction });
    await audit({ shopId: null, userId: reset.userId, action: 'password.reset', entity: 'user', entityId: reset.userId }, transaction);
    return reset.userId;
  });
  // sign the person out everywhere: their sessions are keyed by user id inside the JSON
  await deps.sequelize.query(`DELETE FROM "session" WHERE sess->'passport'->'user'->>'id' = :userId`, { replacements: { userId } });
  forgetSessionsOf(userId);
}

async function openInvitation(raw: string, transaction?: import('sequelize').Transaction) {
  const inv = await Invitation.findOne({ where: { tokenHash: hashToken(raw) }, transaction, lock: transaction ? true : undefined });
  if (!inv) throw new AppError(404, 'not_found', 'This invitation link is not valid. Ask your shop admin to send a new one.');
  if (inv.acceptedAt || inv.expiresAt.getTime() < Date.now()) {
    throw new AppError(410, 'link_expired', 'This invitation has expired or was already used. Ask your shop admin to send a new one.');
  }
  return inv;
}

export async function previewInvitation(raw: string) {
  const inv = await openInvitation(raw);
  const shop = await Shop.findByPk(inv.shopId);
  const existing = await User.findOne({ where: { email: inv.email }, attributes: ['id'] });
  return { email: inv.email, name: inv.name, roles: inv.roles, shopName: shop?.name ?? '', hasAccount: !!existing };
}

/** Creates the account (or, for an existing account, checks its password) and adds the membership. */
export async function acceptInvitation(deps: AppDeps, input: AcceptInvitationInput): Promise<User> {
  return deps.sequelize.transaction(async (transaction) => {
    const inv = await openInvitation(input.token, transaction);
    let user = await User.findOne({ where: { email: inv.email }, transaction });
    if (user) {
      if (!(await checkPassword(input.password, user.passwordHash))) {
        throw new AppError(400, 'invalid_input', 'You already have an account: enter its password to join this shop.',
          [{ path: 'password', message: 'Enter the password of your existing account' }]);
      }
    } else {
      user = await User.create({ email: inv.email, name: input.name, passwordHash: await hashPassword(input.password) }, { transaction });
    }
    const existing = await Membership.findOne({ where: { shopId: inv.shopId, userId: user.id }, transaction });
    if (existing) {
      await existing.update({ roles: [...new Set([...existing.roles, ...inv.roles])] }, { transaction });
    } else {
      await Membership.create({ shopId: inv.shopId, userId: user.id, roles: inv.roles }, { transaction });
    }
    await inv.update({ acceptedAt: new Date() }, { transaction });
    await Invitation.update({ acceptedAt: new Date() },
      { where: { shopId: inv.shopId, email: inv.email, acceptedAt: null, id: { [Op.ne]: inv.id } }, transaction });
    await audit({ shopId: inv.shopId, userId: user.id, action: 'invitation.accepted', entity: 'invitation', entityId: inv.id }, transaction);
    const joined = user.id;
    transaction.afterCommit(() => forgetMembership(joined, inv.shopId));
    return user;
  });
}
