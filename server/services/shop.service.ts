import type { AppDeps } from '../deps';
import { forgetMembership, type ShopContext } from '../auth/context';
import { forgetSessionsOf } from '../auth/session-store';
import { Invitation, Membership, Shop, User } from '../models';
import { AppError, notFound } from '../lib/errors';
import { newLinkToken } from '../lib/tokens';
import type { InviteInput } from '@shared/schema/auth';
import type { Role } from '@shared/schema/roles';
import type { ShopSettingsInput } from '@shared/schema/shop';
import { audit } from './audit';
import { localeFormat } from '@shared/format/locale';

export const INVITATION_DAYS = 7;

export async function listMembers(ctx: ShopContext) {
  const rows = await Membership.findAll({
    where: { shopId: ctx.shopId },
    include: [{ model: User, as: 'user', attributes: ['id', 'email', 'name'] }],
    order: [['createdAt', 'ASC']],
  });
  return rows.map((m) => {
    const u = (m as Membership & { user: User }).user;
    return { id: m.id, userId: u.id, email: u.email, name: u.name, roles: m.roles, since: m.createdAt.toISOString(), disabled: m.disabledAt !== null };
  });
}

async function countAdmins(shopId: string, exceptMembershipId: string): Promise<number> {
  const rows = await Membership.findAll({ where: { shopId, disabledAt: null }, attributes: ['id', 'roles'] });
  return rows.filter((m) => m.id !== exceptMembershipId && m.roles.includes('admin')).length;
}

export async function updateMemberRoles(deps: AppDeps, ctx: ShopContext, membershipId: string, roles: Role[]) {
  const m = await Membership.findOne({ where: { id: membershipId, shopId: ctx.shopId } });
  if (!m) throw notFound('That member');
  if (!roles.includes('admin') && m.roles.includes('admin') && (await countAdmins(ctx.shopId, m.id)) === 0) {
    throw new AppError(409, 'last_admin', 'A shop needs at least one admin. Make someone else an admin first.');
  }
  await deps.sequelize.transaction(async (transaction) => {
    await m.update({ roles: [...new Set(roles)] }, { transaction });
    transaction.afterCommit(() => forgetMembership(m.userId, m.shopId));
    await audit({ shopId: ctx.shopId, userId: ctx.userId, action: 'member.roles_changed', entity: 'membership', entityId: m.id, detail: { roles } }, transaction);
  });
  return { id: m.id, roles: m.roles };
}

export async function removeMember(deps: AppDeps, ctx: ShopContext, membershipId: string) {
  const m = await Membership.findOne({ where: { id: membershipId, shopId: ctx.shopId } });
  if (!m) throw notFound('That member');
  if (m.roles.includes('admin') && (await countAdmins(ctx.shopId, m.id)) === 0) {
    throw new AppError(409, 'last_admin', 'A shop needs at least one admin. Make someone else an admin first.');
  }
  await deps.sequelize.transaction(async (transaction) => {
    await m.destroy({ transaction });
    transaction.afterCommit(() => forgetMembership(m.userId, m.shopId));
    await audit({ shopId: ctx.shopId, userId: ctx.userId, action: 'member.removed', entity: 'membership', entityId: m.id }, transaction);
  });
}

/**
 * Disables a member (they can no longer open the shop, and every session of theirs in it ends at
 * once, here and on the other app servers) or enables them again. Roles and history stay.
 */
export async function setMemberDisabled(deps: AppDeps, ctx: ShopContext, membershipId: string, disabled: boolean) {
  const m = await Membership.findOne({ where: { id: membershipId, shopId: ctx.shopId } });
  if (!m) throw notFound('That member');
  // The caller is an enabled admin who may not disable themselves, so an enabled admin always remains.
  if (disabled && m.userId === ctx.userId) {
    throw new AppError(409, 'disable_self', 'You cannot disable yourself. Ask another admin, or sign out.');
  }
  await deps.sequelize.transaction(async (transaction) => {
    await m.update({ disabledAt: disabled ? new Date() : null }, { transaction });
    if (disabled) {
      // their sessions in this shop (or in none yet); a session open in another shop of theirs goes on
      await deps.sequelize.query(
        `DELETE FROM "session" WHERE sess->'passport'->'user'->>'id' = :userId AND coalesce(sess->>'shopId', :shopId) = :shopId`,
        { replacements: { userId: m.userId, shopId: ctx.shopId }, transaction },
      );
    }
    transaction.afterCommit(() => {
      forgetMembership(m.userId, m.shopId);
      if (disabled) forgetSessionsOf(m.userId);
    });
    await audit({ shopId: ctx.shopId, userId: ctx.userId, action: disabled ? 'member.disabled' : 'member.enabled', entity: 'membership', entityId: m.id }, transaction);
  });
  return { id: m.id, disabled };
}

export async function listInvitations(ctx: ShopContext) {
  const rows = await Invitation.findAll({ where: { shopId: ctx.shopId }, order: [['createdAt', 'DESC']], limit: 200 });
  const now = Date.now();
  return rows.map((i) => ({
    id: i.id, email: i.email, name: i.name, roles: i.roles, createdAt: i.createdAt.toISOString(),
    expiresAt: i.expiresAt.toISOString(),
    state: i.acceptedAt ? 'accepted' : i.expiresAt.getTime() < now ? 'expired' : 'open',
  }));
}

/** Stores the invitation and e-mails its single-use link; a failed send stores nothing. */
export async function invite(deps: AppDeps, ctx: ShopContext, input: InviteInput) {
  const existing = await Membership.findOne({
    where: { shopId: ctx.shopId },
    include: [{ model: User, as: 'user', where: { email: input.email }, attributes: ['id'] }],
  });
  if (existing) {
    throw new AppError(409, 'already_member', `${input.email} is already a member of this shop. Change their roles in the members table instead.`,
      [{ path: 'email', message: 'Already a member of this shop' }]);
  }
  const shop = await Shop.findByPk(ctx.shopId);
  const inviter = await User.findByPk(ctx.userId);
  const token = newLinkToken();
  return deps.sequelize.transaction(async (transaction) => {
    const inv = await Invitation.create({
      shopId: ctx.shopId, email: input.email, name: input.name, roles: input.roles, tokenHash: token.hash,
      invitedBy: ctx.userId, acceptedAt: null, expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000),
    }, { transaction });
    await audit({ shopId: ctx.shopId, userId: ctx.userId, action: 'invitation.sent', entity: 'invitation', entityId: inv.id, detail: { email: input.email, roles: input.roles } }, transaction);
    const link = `${deps.config.appUrl}/invitation?token=${token.raw}`;
    await deps.mailer.send({
      to: input.email,
      subject: `You are invited to ${shop?.name ?? 'a shop'} on Sparkwright`,
      text: `Hello${input.name ? ' ' + input.name : ''},\n\n${inviter?.name ?? 'A shop admin'} invited you to join ${shop?.name ?? 'their shop'} ` +
        `on Sparkwright as ${input.roles.join(', ')}.\n\nOpen this link within ${INVITATION_DAYS} days (until ${localeFormat(shop?.locale, { withTimeZone: true }).dateTime(inv.expiresAt)}) to accept; it works once:\n\n${link}\n`,
    });
    return { id: inv.id, email: inv.email, roles: inv.roles, expiresAt: inv.expiresAt.toISOString() };
  });
}

export async function revokeInvitation(ctx: ShopContext, id: string) {
  const inv = await Invitation.findOne({ where: { id, shopId: ctx.shopId } });
  if (!inv) throw notFound('That invitation');
  await inv.destroy();
}

export async function getSettings(ctx: ShopContext) {
  const shop = await Shop.findByPk(ctx.shopId);
  if (!shop) throw notFound('That shop');
  return { name: shop.name, settings: { comebackDays: 30, abandonAfterHours: 24, serviceDeskEmail: '', ...shop.settings }, locale: shop.locale ?? null };
}

export async function updateSettings(ctx: ShopContext, input: ShopSettingsInput) {
  const shop = await Shop.findByPk(ctx.shopId);
  if (!shop) throw notFound('That shop');
  const locale = input.locale === undefined ? {} : { locale: input.locale };
  await shop.update({ name: input.name, settings: { ...shop.settings, ...input.settings }, ...locale });
  await audit({ shopId: ctx.shopId, userId: ctx.userId, action: 'shop.settings_changed', entity: 'shop', entityId: shop.id, ...(input.locale === undefined ? {} : { detail: { locale: input.locale } }) });
  return getSettings(ctx);
}
