import type { RequestHandler, Request } from 'express';
import type { Role } from '@shared/schema/roles';
import { Membership } from '../models';
import { AppError, forbidden, unauthenticated } from '../lib/errors';

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

/** Loads the membership of the signed-in user in the session's current shop. */
export const requireShop: RequestHandler = async (req, _res, next) => {
  if (!req.user) return next(unauthenticated());
  const shopId = req.session.shopId;
  const membership = shopId ? await Membership.findOne({ where: { shopId, userId: req.user.id } }) : null;
  if (!membership) {
    return next(new AppError(403, 'no_shop', 'You are not a member of a shop yet. Ask a shop admin for an invitation.'));
  }
  req.ctx = { userId: req.user.id, shopId: membership.shopId, roles: membership.roles };
  next();
};

/** Allows the request when the member holds any of the roles. Use after requireShop. */
export function requireRole(...allowed: Role[]): RequestHandler {
  return (req, _res, next) => {
    if (!req.ctx) return next(unauthenticated());
    if (!req.ctx.roles.some((r) => allowed.includes(r))) return next(forbidden());
    next();
  };
}

export function ctxOf(req: Request): ShopContext {
  if (!req.ctx) throw unauthenticated();
  return req.ctx;
}
