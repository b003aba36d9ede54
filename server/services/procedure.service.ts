import { QueryTypes, type Transaction } from 'sequelize';
import type { ShopContext } from '../auth/context';
import type { AppDeps } from '../deps';
import { Procedure, ProcedureVersion } from '../models';
import { AppError, notFound } from '../lib/errors';
import { CURRENT_SCHEMA_VERSION, type ProcedureDocument, type ProcedureMeta } from '@shared/schema';
import { audit } from './audit';
import { findProcedure, namesOf, readsDrafts, uniqueSlug, versionSummary, type VersionSummary } from './procedure-common';
import { lintDocument } from './procedure-lint';
import type { ProcedureListQuery } from './procedure-inputs';

export interface ProcedureRow {
  id: string;
  slug: string;
  title: string;
  symptom: string;
  ignitionSystem: string;
  archived: boolean;
  draft: { id: string; status: 'draft' | 'in_review'; lockVersion: number } | null;
  published: { id: string; number: number; publishedAt: string | null } | null;
  lastEditedBy: string | null;
  lastEditedAt: string;
  diagnoses: number;
}

interface RawRow {
  id: string; slug: string; title: string; symptom: string; ignition_system: string; archived_at: Date | null;
  updated_at: Date; draft_id: string | null; draft_status: 'draft' | 'in_review' | null; draft_lock: number | null;
  pub_id: string | null; pub_number: number | null; pub_at: Date | null;
  last_at: Date | null; last_by: string | null; diagnoses: string;
}

const LIST_SQL = `
SELECT p.id, p.slug, p.title, p.symptom, p.ignition_system, p.archived_at, p.updated_at,
  d.id AS draft_id, d.status AS draft_status, d.lock_version AS draft_lock,
  pub.id AS pub_id, pub.number AS pub_number, pub.published_at AS pub_at,
  last.updated_at AS last_at, u.name AS last_by,
  (SELECT count(*) FROM diagnoses g JOIN procedure_versions gv ON gv.id = g.procedure_version_id
     WHERE gv.procedure_id = p.id AND g.shop_id = p.shop_id) AS diagnoses
FROM procedures p
LEFT JOIN procedure_versions d ON d.procedure_id = p.id AND d.status IN ('draft', 'in_review')
LEFT JOIN LATERAL (SELECT id, number, published_at FROM procedure_versions
  WHERE procedure_id = p.id AND status = 'published' ORDER BY number DESC LIMIT 1) pub ON true
LEFT JOIN LATERAL (SELECT updated_at, COALESCE(updated_by, published_by, created_by) AS by FROM procedure_versions
  WHERE procedure_id = p.id AND (:drafts OR status IN ('published', 'retired')) ORDER BY updated_at DESC LIMIT 1) last ON true
LEFT JOIN users u ON u.id = last.by
WHERE p.shop_id = :shopId
  AND (:q = '' OR p.title ILIKE :like OR p.symptom ILIKE :like OR p.slug ILIKE :like)
  AND (p.archived_at IS NOT NULL) = :archived
ORDER BY p.title, p.id
LIMIT 500`;

function matchesStatus(row: ProcedureRow, status: ProcedureListQuery['status']): boolean {
  switch (status) {
    case 'any': return true;
    case 'draft': return row.draft?.status === 'draft';
    case 'in_review': return row.draft?.status === 'in_review';
    case 'published': return row.published !== null;
    case 'unpublished': return row.published === null;
  }
}

/** The Drafting home table; readers without a drafting role see only procedures with a published version. */
export async function listProcedures(deps: AppDeps, ctx: ShopContext, query: ProcedureListQuery): Promise<ProcedureRow[]> {
  const drafts = readsDrafts(ctx);
  const q = query.q ?? '';
  const raw = await deps.sequelize.query<RawRow>(LIST_SQL, {
    type: QueryTypes.SELECT,
    replacements: { shopId: ctx.shopId, q, like: `%${q.replace(/[%_\\]/g, (c) => '\\' + c)}%`, archived: query.archived === '1', drafts },
  });
  const rows = raw.map((r): ProcedureRow => ({
    id: r.id, slug: r.slug, title: r.title, symptom: r.symptom, ignitionSystem: r.ignition_system,
    archived: r.archived_at !== null,
    draft: drafts && r.draft_id ? { id: r.draft_id, status: r.draft_status!, lockVersion: r.draft_lock! } : null,
    published: r.pub_id ? { id: r.pub_id, number: r.pub_number!, publishedAt: r.pub_at?.toISOString() ?? null } : null,
    lastEditedBy: r.last_by, lastEditedAt: (r.last_at ?? r.updated_at).toISOString(),
    diagnoses: Number(r.diagnoses),
  }));
  return rows.filter((r) => (drafts || r.published !== null) && matchesStatus(r, query.status));
}

/** What a brand-new procedure starts from: one Task, so the canvas is never empty. */
export function starterDocument(meta: ProcedureMeta): ProcedureDocument {
  return {
    schemaVersion: CURRENT_SCHEMA_VERSION,
    meta,
    start: 'prepare',
    steps: [{
      id: 'prepare', kind: 'task', title: 'Prepare the machine', instructions: 'Park the machine on a stand, engine off, fuel tap closed.',
      safety: [], hazards: [], position: { x: 0, y: 0 }, confirmLabel: 'Done',
    }],
  };
}

/** Creates a procedure with its first draft (from `document`, or the starter) in one transaction. */
export async function createProcedure(
  deps: AppDeps, ctx: ShopContext,
  input: { meta: ProcedureMeta; document?: ProcedureDocument; action?: string; alsoStore?: (ids: { procedureId: string; draftId: string }, t: Transaction) => Promise<unknown> },
): Promise<{ procedureId: string; draftId: string }> {
  const document = input.document ?? starterDocument(input.meta);
  return deps.sequelize.transaction(async (transaction) => {
    const p = await Procedure.create({
      shopId: ctx.shopId, slug: await uniqueSlug(ctx.shopId, input.meta.title, transaction), title: input.meta.title,
      symptom: input.meta.symptom, ignitionSystem: input.meta.ignitionSystem, archivedAt: null, createdBy: ctx.userId,
    }, { transaction });
    const v = await ProcedureVersion.create({
      shopId: ctx.shopId, procedureId: p.id, number: null, status: 'draft', document: document as unknown as Record<string, unknown>,
      lintReport: lintDocument(document).findings, basedOnId: null, createdBy: ctx.userId, updatedBy: ctx.userId,
      publishedBy: null, publishedAt: null, retiredAt: null,
    }, { transaction });
    await input.alsoStore?.({ procedureId: p.id, draftId: v.id }, transaction);
    await audit({ shopId: ctx.shopId, userId: ctx.userId, action: input.action ?? 'procedure.created', entity: 'procedure', entityId: p.id }, transaction);
    return { procedureId: p.id, draftId: v.id };
  });
}

/** Copies the open draft (or else the latest published version) into a new procedure's draft. */
export async function duplicateProcedure(deps: AppDeps, ctx: ShopContext, id: string, title?: string): Promise<{ procedureId: string; draftId: string }> {
  const p = await findProcedure(ctx, id);
  const source = await ProcedureVersion.findOne({
    where: { procedureId: p.id, shopId: ctx.shopId, status: ['draft', 'in_review', 'published'] },
    order: [['status', 'ASC'], ['number', 'DESC NULLS FIRST']],
  });
  if (!source) throw new AppError(409, 'nothing_to_copy', 'This procedure has no draft or published version to copy.');
  const doc = source.document as unknown as ProcedureDocument;
  const meta = { ...doc.meta, title: title ?? `${p.title} (copy)`.slice(0, 120) };
  return createProcedure(deps, ctx, { meta, document: { ...doc, meta }, action: 'procedure.duplicated' });
}

/** Archiving hides a procedure from the list and from the Bench's choices; its versions stay. */
export async function setArchived(ctx: ShopContext, id: string, archived: boolean): Promise<{ archived: boolean }> {
  const p = await findProcedure(ctx, id);
  await p.update({ archivedAt: archived ? new Date() : null });
  await audit({ shopId: ctx.shopId, userId: ctx.userId, action: archived ? 'procedure.archived' : 'procedure.restored', entity: 'procedure', entityId: p.id });
  return { archived };
}

export interface ProcedureDetail {
  id: string; slug: string; title: string; symptom: string; ignitionSystem: string; archived: boolean;
  versions: VersionSummary[];
}

/** A procedure with its versions, newest first (drafts first for authors and leads). */
export async function getProcedure(ctx: ShopContext, id: string): Promise<ProcedureDetail> {
  const p = await findProcedure(ctx, id);
  const versions = await ProcedureVersion.findAll({
    where: { procedureId: p.id, shopId: ctx.shopId, ...(readsDrafts(ctx) ? {} : { status: ['published', 'retired'] }) },
    attributes: { exclude: ['document'] },
    order: [['number', 'DESC NULLS FIRST']],
  });
  if (versions.length === 0) throw notFound('That procedure');
  const names = await namesOf(versions.flatMap((v) => [v.updatedBy, v.createdBy, v.publishedBy]));
  return {
    id: p.id, slug: p.slug, title: p.title, symptom: p.symptom, ignitionSystem: p.ignitionSystem, archived: p.archivedAt !== null,
    versions: versions.map((v) => versionSummary(v, names)),
  };
}
