import { UniqueConstraintError, type Transaction } from 'sequelize';
import type { ShopContext } from '../auth/context';
import type { AppDeps } from '../deps';
import { Procedure, ProcedureVersion } from '../models';
import { AppError, conflict, notFound } from '../lib/errors';
import { upgradeProcedure, type ProcedureDocument } from '@shared/schema';
import { audit } from './audit';
import { expectStatus, findProcedure, findVersion, namesOf, versionSummary, type VersionSummary } from './procedure-common';
import { lintDocument } from './procedure-lint';
import { linkCatalogue, resolvedLinks } from './procedure-links';
import type { SaveDraftBody } from './procedure-inputs';
import { checkPictureRefs } from './step-picture.service';

export interface VersionDetail extends VersionSummary {
  document: ProcedureDocument;
  lintReport: unknown[];
}

/** Stored documents pass through the shared upgrade, so an older schemaVersion still opens. */
function storedDocument(v: ProcedureVersion): ProcedureDocument {
  const up = upgradeProcedure(v.document);
  if (!up.ok) throw new AppError(500, 'stored_document_invalid', 'This version is stored in a shape the app cannot read. Tell the engineers its id.');
  return up.document;
}

async function detail(v: ProcedureVersion, transaction?: Transaction): Promise<VersionDetail> {
  const names = await namesOf([v.updatedBy, v.createdBy, v.publishedBy], transaction);
  return { ...versionSummary(v, names), document: storedDocument(v), lintReport: v.lintReport };
}

export async function getVersion(ctx: ShopContext, procedureId: string, versionId: string): Promise<VersionDetail> {
  await findProcedure(ctx, procedureId);
  return detail(await findVersion(ctx, procedureId, versionId));
}

/** Runs `work` on one version row, locked, inside a transaction. */
async function withVersion<T>(
  deps: AppDeps, ctx: ShopContext, ids: { procedureId: string; versionId: string },
  work: (v: ProcedureVersion, p: Procedure, t: Transaction) => Promise<T>,
): Promise<T> {
  return deps.sequelize.transaction(async (t) => {
    const p = await findProcedure(ctx, ids.procedureId, { transaction: t, lock: true });
    const v = await findVersion(ctx, ids.procedureId, ids.versionId, { transaction: t, lock: true });
    return work(v, p, t);
  });
}

async function staleSave(v: ProcedureVersion, t: Transaction): Promise<AppError> {
  const names = await namesOf([v.updatedBy], t);
  const by = names.get(v.updatedBy ?? '') ?? 'someone';
  return new AppError(409, 'stale_draft',
    `${by} saved this draft at ${v.updatedAt.toISOString()} after you opened it. Reload their version, or keep your copy as a new procedure.`,
    undefined, { changedBy: by, changedAt: v.updatedAt.toISOString(), lockVersion: v.lockVersion });
}

function syncMeta(p: Procedure, doc: ProcedureDocument, t: Transaction): Promise<unknown> {
  return p.update({ title: doc.meta.title, symptom: doc.meta.symptom, ignitionSystem: doc.meta.ignitionSystem }, { transaction: t });
}

/**
 * Saves a draft if nobody else saved it since the author loaded `lockVersion`; otherwise 409
 * with who changed it and when, and nothing is written.
 */
export async function saveDraft(deps: AppDeps, ctx: ShopContext, ids: { procedureId: string; versionId: string }, body: SaveDraftBody): Promise<VersionDetail> {
  return withVersion(deps, ctx, ids, async (v, p, t) => {
    expectStatus(v, ['draft'], 'edited (published versions never change; start a new draft from them)');
    if (v.lockVersion !== body.lockVersion) throw await staleSave(v, t);
    await checkPictureRefs(deps, ctx, body.document, t);
    const hasLinks = body.document.steps.some((s) => s.kind === 'link');
    const catalogue = hasLinks ? (await linkCatalogue(ctx.shopId, p.slug, { forPublish: false, transaction: t })).catalogue : undefined;
    await v.update({
      document: body.document as unknown as Record<string, unknown>, lintReport: lintDocument(body.document, catalogue).findings,
      lockVersion: v.lockVersion + 1, updatedBy: ctx.userId,
    }, { transaction: t });
    const published = await ProcedureVersion.count({ where: { procedureId: p.id, status: ['published', 'retired'] }, transaction: t });
    if (published === 0) await syncMeta(p, body.document, t);
    return detail(v, t);
  });
}

/** Starts the one open draft of a procedure from a numbered version (the latest published by default). */
export async function startDraft(deps: AppDeps, ctx: ShopContext, procedureId: string, fromVersionId?: string): Promise<VersionDetail> {
  return deps.sequelize.transaction(async (t) => {
    const p = await findProcedure(ctx, procedureId, { transaction: t, lock: true });
    const source = fromVersionId
      ? await findVersion(ctx, p.id, fromVersionId, { transaction: t })
      : await ProcedureVersion.findOne({ where: { procedureId: p.id, shopId: ctx.shopId, status: 'published' }, order: [['number', 'DESC']], transaction: t });
    if (!source) throw notFound('A published version to start from');
    expectStatus(source, ['published', 'retired'], 'used as a starting point (only numbered versions are)');
    try {
      const v = await ProcedureVersion.create({
        shopId: ctx.shopId, procedureId: p.id, number: null, status: 'draft', document: source.document,
        lintReport: source.lintReport, basedOnId: source.id, createdBy: ctx.userId, updatedBy: ctx.userId,
        publishedBy: null, publishedAt: null, retiredAt: null,
      }, { transaction: t });
      await audit({ shopId: ctx.shopId, userId: ctx.userId, action: 'procedure.draft_started', entity: 'procedure_version', entityId: v.id }, t);
      return await detail(v, t);
    } catch (e) {
      if (e instanceof UniqueConstraintError) throw conflict('This procedure already has an open draft. Open it from the list instead of starting another.');
      throw e;
    }
  });
}

type Move = 'submit' | 'take-back' | 'send-back' | 'publish' | 'retire';

/**
 * The review life cycle: draft → in review → published (or back to draft: sent back by a lead,
 * or taken back by an author who spotted something before the review); published → retired.
 */
export async function moveVersion(deps: AppDeps, ctx: ShopContext, ids: { procedureId: string; versionId: string }, move: Move): Promise<VersionDetail> {
  return withVersion(deps, ctx, ids, async (v, p, t) => {
    if (move === 'submit') {
      expectStatus(v, ['draft'], 'sent for review');
      await v.update({ status: 'in_review', updatedBy: ctx.userId, lockVersion: v.lockVersion + 1 }, { transaction: t });
    } else if (move === 'send-back' || move === 'take-back') {
      expectStatus(v, ['in_review'], move === 'send-back' ? 'sent back' : 'taken back (it is no longer in review)');
      await v.update({ status: 'draft', lockVersion: v.lockVersion + 1 }, { transaction: t });
    } else if (move === 'publish') {
      expectStatus(v, ['in_review'], 'published (send it for review first)');
      await publish(ctx, v, p, t);
    } else {
      expectStatus(v, ['published'], 'retired');
      await v.update({ status: 'retired', retiredAt: new Date() }, { transaction: t });
    }
    await audit({ shopId: ctx.shopId, userId: ctx.userId, action: `procedure.${move}`, entity: 'procedure_version', entityId: v.id, detail: { number: v.number } }, t);
    return detail(v, t);
  });
}

/** Publishing re-runs the soundness check here, never trusting the client's report. */
async function publish(ctx: ShopContext, v: ProcedureVersion, p: Procedure, t: Transaction): Promise<void> {
  const doc = storedDocument(v);
  const { catalogue, published } = await linkCatalogue(ctx.shopId, p.slug, { forPublish: true, transaction: t });
  const lint = lintDocument(doc, catalogue);
  if (lint.errors > 0) {
    throw new AppError(422, 'unsound_procedure',
      `The soundness check found ${lint.errors} error${lint.errors === 1 ? '' : 's'}; send the draft back so the author can fix them.`,
      lint.findings.filter((f) => f.severity === 'error').map((f) => ({ path: `steps.${f.steps[0] ?? ''}`, message: f.message })));
  }
  const last = (await ProcedureVersion.max<number, ProcedureVersion>('number', { where: { procedureId: p.id }, transaction: t })) ?? 0;
  await v.update({
    status: 'published', number: last + 1, lintReport: lint.findings, links: resolvedLinks(doc, published), publishedBy: ctx.userId, publishedAt: new Date(),
    lockVersion: v.lockVersion + 1,
  }, { transaction: t });
  await syncMeta(p, doc, t);
}
