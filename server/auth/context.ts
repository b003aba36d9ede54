import type { RequestHandler, Request } from 'express';
import type { Role } from '@shared/schema/roles';
import { LRUCache } from 'lru-cache';
import { announce, onEviction } from '../lib/cache-bus';
import { Membership } from '../models';
import { AppError, unauthenticated } from '../lib/errors';

export interface SessionUser { id: string; email: string; name: string }

declare module 'express-session' {
  interface SessionData {
    shopId?: string;
  }
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
    interface Request {
      ctx?: ShopContext;
    }
  }
}

/** Who is asking, for which shop, with which roles: resolved on the server for every request. */
export interface ShopContext { userId: string; shopId: string; roles: Role[] }

export const requireUser: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(unauthenticated());
  next();
};

/**
 * Roles per user and shop, kept briefly per process so that a request costs no membership query.
 * Changing roles, removing a member and accepting an invitation forget the entry on commit, here
 * and, through the cache bus, on every other app server (within this time should the bus be down).
 */
export const MEMBERSHIP_CACHE_MS = 30_000;
const memberships = new LRUCache<string, Role[] | 'disabled'>({ max: 20_000, ttl: MEMBERSHIP_CACHE_MS });
const memberKey = (userId: string, shopId: string) => `${userId}:${shopId}`;

onEviction('membership', (key) => memberships.delete(key), () => memberships.clear());

export function forgetMembership(userId: string, shopId: string): void {
  announce('membership', memberKey(userId, shopId));
}

async function rolesIn(userId: string, shopId: string): Promise<Role[] | 'disabled' | null> {
  const hit = memberships.get(memberKey(userId, shopId));
  if (hit) return hit;
  const membership = await Membership.findOne({ where: { shopId, userId }, attributes: ['roles', 'disabledAt'] });
  if (!membership) return null;
  const roles = membership.disabledAt ? 'disabled' : membership.roles;
  memberships.set(memberKey(userId, shopId), roles);
  return roles;
}

/** Resolves the membership of the signed-in user in the session's current shop. */
export const requireShop: RequestHandler = async (req, _res, next) => {
  if (!req.user) return next(unauthenticated());
  const shopId = req.session.shopId;
  const roles = shopId ? await rolesIn(req.user.id, shopId) : null;
  if (roles === 'disabled') {
    return next(new AppError(403, 'member_disabled', 'A shop admin has disabled your membership of this shop. Ask them to enable it again.'));
  }
  if (!shopId || !roles) {
    return next(new AppError(403, 'no_shop', 'You are not a member of a shop yet. Ask a shop admin for an invitation.'));
  }
  req.ctx = { userId: req.user.id, shopId, roles: [...roles] };
  next();
};

export function ctxOf(req: Request): ShopContext {
  if (!req.ctx) throw unauthenticated();
  return req.ctx;
}
