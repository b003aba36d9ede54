import type { ShopContext } from '../auth/context';
import { ReviewComment } from '../models';
import { findProcedure, findVersion, namesOf } from './procedure-common';
import { audit } from './audit';
import type { AppDeps } from '../deps';
import { moveVersion, type VersionDetail } from './procedure-version.service';

export interface ReviewCommentDto { id: string; author: string | null; stepId: string | null; body: string; createdAt: string }

async function toDtos(rows: ReviewComment[]): Promise<ReviewCommentDto[]> {
  const names = await namesOf(rows.map((r) => r.authorId));
  return rows.map((r) => ({ id: r.id, author: names.get(r.authorId ?? '') ?? null, stepId: r.stepId, body: r.body, createdAt: r.createdAt.toISOString() }));
}

export async function listComments(ctx: ShopContext, ids: { procedureId: string; versionId: string }): Promise<ReviewCommentDto[]> {
  await findProcedure(ctx, ids.procedureId);
  const v = await findVersion(ctx, ids.procedureId, ids.versionId);
  const rows = await ReviewComment.findAll({ where: { shopId: ctx.shopId, procedureVersionId: v.id }, order: [['createdAt', 'ASC'], ['id', 'ASC']] });
  return toDtos(rows);
}

/** A review comment on a version, optionally about one step. */
export async function addComment(
  ctx: ShopContext, ids: { procedureId: string; versionId: string }, input: { body: string; stepId?: string | undefined },
): Promise<ReviewCommentDto> {
  await findProcedure(ctx, ids.procedureId);
  const v = await findVersion(ctx, ids.procedureId, ids.versionId);
  const row = await ReviewComment.create({ shopId: ctx.shopId, procedureVersionId: v.id, authorId: ctx.userId, stepId: input.stepId ?? null, body: input.body });
  await audit({ shopId: ctx.shopId, userId: ctx.userId, action: 'procedure.commented', entity: 'procedure_version', entityId: v.id });
  const [dto] = await toDtos([row]);
  return dto!;
}

/** A lead sends a draft back to its author, with the reason as a comment when given. */
export async function sendBack(
  deps: AppDeps, ctx: ShopContext, ids: { procedureId: string; versionId: string }, comment?: string,
): Promise<VersionDetail> {
  const moved = await moveVersion(deps, ctx, ids, 'send-back');
  if (comment) await addComment(ctx, ids, { body: comment });
  return moved;
}
