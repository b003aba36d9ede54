import type { Transaction } from 'sequelize';
import type { ShopContext } from '../auth/context';
import { Procedure, ProcedureVersion, User } from '../models';
import { AppError, notFound } from '../lib/errors';
import { can } from '../auth/policy';

/** Authors and leads see drafts and reviews; everyone else only numbered versions. */
export function readsDrafts(ctx: ShopContext): boolean {
  return can(ctx, 'procedure.draft');
}

interface LoadOptions { transaction?: Transaction; lock?: boolean }

/** A procedure of the caller's shop; anything else is a 404, like an id that never existed. */
export async function findProcedure(ctx: ShopContext, id: string, opts: LoadOptions = {}): Promise<Procedure> {
  const p = await Procedure.findOne({
    where: { id, shopId: ctx.shopId },
    ...(opts.transaction ? { transaction: opts.transaction } : {}),
    ...(opts.lock && opts.transaction ? { lock: opts.transaction.LOCK.UPDATE } : {}),
  });
  if (!p) throw notFound('That procedure');
  return p;
}

/**
 * A version of a procedure of the caller's shop. Readers without a drafting role get a 404 for
 * drafts and reviews, so a draft's existence does not leak to them.
 */
export async function findVersion(ctx: ShopContext, procedureId: string, versionId: string, opts: LoadOptions = {}): Promise<ProcedureVersion> {
  const v = await ProcedureVersion.findOne({
    where: { id: versionId, procedureId, shopId: ctx.shopId },
    ...(opts.transaction ? { transaction: opts.transaction } : {}),
    ...(opts.lock && opts.transaction ? { lock: opts.transaction.LOCK.UPDATE } : {}),
  });
  if (!v) throw notFound('That version');
  if (!readsDrafts(ctx) && (v.status === 'draft' || v.status === 'in_review')) throw notFound('That version');
  return v;
}

export function expectStatus(v: ProcedureVersion, allowed: ProcedureVersion['status'][], doing: string): void {
  if (allowed.includes(v.status)) return;
  const now = v.status === 'in_review' ? 'in review' : v.status;
  throw new AppError(409, 'wrong_status', `This version is ${now}, so it cannot be ${doing}. Reload to see its current state.`);
}

/** Display names of users by id, in one query. */
export async function namesOf(ids: (string | null | undefined)[], transaction?: Transaction): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((x): x is string => typeof x === 'string'))];
  if (wanted.length === 0) return new Map();
  const users = await User.findAll({ where: { id: wanted }, attributes: ['id', 'name'], ...(transaction ? { transaction } : {}) });
  return new Map(users.map((u) => [u.id, u.name]));
}

/** kebab-case slug from a title, made unique in the shop with -2, -3 ... */
export async function uniqueSlug(shopId: string, title: string, transaction?: Transaction): Promise<string> {
  const base = title.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'procedure';
  const taken = new Set(
    (await Procedure.findAll({ where: { shopId }, attributes: ['slug'], ...(transaction ? { transaction } : {}) })).map((p) => p.slug),
  );
  if (!taken.has(base)) return base;
  for (let n = 2; ; n++) if (!taken.has(`${base}-${n}`)) return `${base}-${n}`;
}

export interface VersionSummary {
  id: string;
  procedureId: string;
  number: number | null;
  status: ProcedureVersion['status'];
  lockVersion: number;
  basedOnId: string | null;
  updatedAt: string;
  updatedBy: string | null;
  publishedAt: string | null;
  publishedBy: string | null;
  retiredAt: string | null;
  errors: number;
  warnings: number;
}

export function versionSummary(v: ProcedureVersion, names: Map<string, string>): VersionSummary {
  const report = (v.lintReport ?? []) as { severity?: string }[];
  return {
    id: v.id,
    procedureId: v.procedureId,
    number: v.number,
    status: v.status,
    lockVersion: v.lockVersion,
    basedOnId: v.basedOnId,
    updatedAt: v.updatedAt.toISOString(),
    updatedBy: names.get(v.updatedBy ?? v.createdBy ?? '') ?? null,
    publishedAt: v.publishedAt?.toISOString() ?? null,
    publishedBy: names.get(v.publishedBy ?? '') ?? null,
    retiredAt: v.retiredAt?.toISOString() ?? null,
    errors: report.filter((f) => f.severity === 'error').length,
    warnings: report.filter((f) => f.severity === 'warning').length,
  };
}
