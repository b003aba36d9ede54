import type { RequestHandler } from 'express';
import { may, readsDiagnoses, type Permission } from '@shared/schema/role-names';
import { forbidden, notFound, unauthenticated } from '../lib/errors';
import type { ShopContext } from './context';

// The one place the server decides who may do what. Routes gate with `allow`, services that are
// reached from several routes (or that decide per row) with `demand` and the diagnosis helpers
// below; the role sets themselves live in shared/schema/role-names.ts, which the app reads too.

/** What each permission lets a member do, for the 403 message. */
const ACTIONS: Record<Permission, string> = {
  'diagnosis.work': 'work on diagnoses',
  'diagnosis.workAny': "work on a colleague's diagnosis",
  'diagnosis.readAll': "read the shop's diagnoses",
  'analytics.read': 'read Debrief analytics',
  'coaching.write': 'write coaching notes',
  'advice.draft': 'turn a proposal into a draft',
  'procedure.author': 'write procedures',
  'procedure.review': 'review and publish procedures',
  'procedure.draft': 'open drafts and reviews',
  'vehicle.edit': 'add or edit machines',
  'shop.manage': 'manage the shop',
};

export function can(ctx: ShopContext, permission: Permission): boolean {
  return may(ctx.roles, permission);
}

/** Throws the 403 when the member lacks the permission. */
export function demand(ctx: ShopContext, permission: Permission): void {
  if (!can(ctx, permission)) throw forbidden(ACTIONS[permission]);
}

/** Route gate: lets the request on when the member holds the permission. Use after requireShop. */
export function allow(permission: Permission): RequestHandler {
  return (req, _res, next) => {
    if (!req.ctx) return next(unauthenticated());
    if (!can(req.ctx, permission)) return next(forbidden(ACTIONS[permission]));
    next();
  };
}

/** Route gate for reading diagnoses: own ones (Bench workers) or the shop's (leads, trainers). */
export const allowDiagnosisReading: RequestHandler = (req, _res, next) => {
  if (!req.ctx) return next(unauthenticated());
  if (!readsDiagnoses(req.ctx.roles)) return next(forbidden('read diagnoses'));
  next();
};

/**
 * Whose diagnoses the member reads: `ownOnly` is their id, or null for the whole shop. A member
 * with no diagnosis role gets the 403.
 */
export function diagnosisScope(ctx: ShopContext): { ownOnly: string | null } {
  if (can(ctx, 'diagnosis.readAll')) return { ownOnly: null };
  if (can(ctx, 'diagnosis.work')) return { ownOnly: ctx.userId };
  throw forbidden('read diagnoses');
}

/**
 * Checks one diagnosis of the shop against the member, given its technician. Someone else's
 * diagnosis the member may not touch does not exist for them (404, like a foreign id).
 */
export function checkDiagnosis(ctx: ShopContext, technicianId: string, mode: 'read' | 'write'): void {
  const own = technicianId === ctx.userId;
  if (mode === 'read') {
    const { ownOnly } = diagnosisScope(ctx);
    if (ownOnly !== null && !own) throw notFound('That diagnosis');
    return;
  }
  demand(ctx, 'diagnosis.work');
  if (!own && !can(ctx, 'diagnosis.workAny')) throw notFound('That diagnosis');
}
