import { UniqueConstraintError } from 'sequelize';
import type { ShopContext } from '../auth/context';
import type { AppDeps } from '../deps';
import { ProcedureVersion } from '../models';
import { AppError, badRequest, conflict, notFound } from '../lib/errors';
import { demand } from '../auth/policy';
import { adviseChain, findCheckChains, reorderChain, type CheckChain } from '@shared/engine/advisor';
import { lintProcedure } from '@shared/engine/lint';
import { branchesOf } from '@shared/engine/kinds';
import type { ProcedureDocument } from '@shared/schema';
import type { AdvisorAnswer, AdvisorChain, AdvisorCheck, AdvisorDraftBody } from '@shared/stats/debrief-schema';
import { audit } from './audit';
import { recordedHandle } from '@shared/engine/kinds';
import { SCOPED, STEP_SCOPE, num, numOrNull, parseDocument, scopeBinds, type Scope, type Sql } from './debrief-scope';

// The check-order advisor over recorded diagnoses: each check's share of revealed faults and its
// median time come from SQL aggregates; the ordering rule lives in shared/engine/advisor.ts.

/**
 * Per chain step: how many ended diagnoses took each branch, and (grouping set by step alone) the
 * median time of the check, in one scan of the step index.
 */
async function chainFigures(sql: Sql, scope: Scope, stepIds: string[]) {
  const rows = await sql(`WITH ${SCOPED}
    SELECT ds.step_id, ds.band_id, ds.answer_id, GROUPING(ds.band_id, ds.answer_id) AS whole_step, count(*) AS n,
      percentile_cont(0.5) WITHIN GROUP (ORDER BY date_part('epoch', ds.answered_at - ds.started_at)) AS median
    FROM diagnosis_steps ds
    WHERE ${STEP_SCOPE} AND NOT ds.superseded AND ds.step_id = ANY($5::text[])
      AND ds.diagnosis_id IN (SELECT id FROM d WHERE status IN ('finished', 'handed_off'))
    GROUP BY GROUPING SETS ((ds.step_id, ds.band_id, ds.answer_id), (ds.step_id))`, [...scopeBinds(scope), stepIds]);
  return {
    rows: rows.filter((r) => num(r.whole_step) === 0),
    medians: new Map(rows.filter((r) => num(r.whole_step) !== 0).map((r) => [String(r.step_id), numOrNull(r.median)])),
  };
}

function estimate(doc: ProcedureDocument, chain: CheckChain, figures: Awaited<ReturnType<typeof chainFigures>>): { entered: number; checks: AdvisorCheck[] } {
  const byId = new Map(doc.steps.map((s) => [s.id, s] as const));
  const reachedOf = (id: string) => figures.rows.filter((r) => r.step_id === id).reduce((a, r) => a + num(r.n), 0);
  const entered = reachedOf(chain.checks[0]!);
  const checks = chain.checks.map((id): AdvisorCheck => {
    const step = byId.get(id)!;
    const target = new Map(branchesOf(step).map((b) => [b.handle, b.to]));
    const revealed = figures.rows
      .filter((r) => r.step_id === id && byId.get(target.get(recordedHandle(r.band_id, r.answer_id)) ?? '')?.kind === 'finding')
      .reduce((a, r) => a + num(r.n), 0);
    const recorded = figures.medians.get(id) ?? null;
    const estimateSeconds = (step.minutes ?? doc.meta.minutesPerStep) * 60;
    return {
      stepId: id, reached: reachedOf(id), revealed, revealShare: entered ? revealed / entered : 0,
      seconds: recorded ?? estimateSeconds, secondsFrom: recorded === null ? 'estimate' : 'recorded',
    };
  });
  return { entered, checks };
}

/** Every chain of independent checks in the version, with the current and the proposed order. */
export async function adviseVersion(sql: Sql, scope: Scope): Promise<AdvisorAnswer> {
  const chains = findCheckChains(scope.doc);
  const all = [...new Set(chains.flatMap((c) => c.checks))];
  const figures = all.length ? await chainFigures(sql, scope, all) : { rows: [], medians: new Map<string, number | null>() };
  const out: AdvisorChain[] = chains.map((chain) => {
    const { entered, checks } = estimate(scope.doc, chain, figures);
    const advice = adviseChain(chain, checks);
    const byStep = new Map(checks.map((c) => [c.stepId, c]));
    return {
      checks: [...chain.checks], tail: chain.tail, entered, current: checks,
      proposed: advice.proposed.map((p) => byStep.get(p.stepId)!),
      currentSeconds: advice.currentSeconds, proposedSeconds: advice.proposedSeconds, changes: advice.changes,
    };
  });
  return { versionId: scope.versionId, chains: out };
}

/**
 * Turns a proposed order into the procedure's one open draft, based on the published version.
 * 409 when a draft is already open; 422 when the reordered procedure would not pass the soundness check.
 */
export async function draftFromAdvice(deps: Pick<AppDeps, 'sequelize'>, sql: Sql, ctx: ShopContext, body: AdvisorDraftBody) {
  demand(ctx, 'advice.draft');
  const [source] = await sql(`SELECT id, procedure_id, number, document, lint_report FROM procedure_versions
    WHERE id = $1 AND shop_id = $2 AND status = 'published'`, [body.versionId, ctx.shopId]);
  if (!source) throw notFound('That published version');
  const doc = parseDocument(source.document);
  const chain = findCheckChains(doc).find((c) => [...c.checks].sort().join() === [...body.order].sort().join() && c.checks.length === body.order.length);
  if (!chain) throw badRequest('The order must hold exactly the checks of one chain of this version. Reload the advisor and try again.', [{ path: 'order', message: 'Not a chain of this version' }]);
  const draftDoc = reorderChain(doc, chain, body.order);
  const report = lintProcedure(draftDoc);
  if (!report.ok) {
    throw new AppError(422, 'lint_failed', 'The reordered procedure would not pass the soundness check, so no draft was made. Reorder it by hand in Drafting.',
      report.findings.filter((f) => f.severity === 'error').map((f) => ({ path: f.steps.join(','), message: f.message })));
  }
  const [open] = await sql(`SELECT v.id, u.name FROM procedure_versions v LEFT JOIN users u ON u.id = v.created_by
    WHERE v.procedure_id = $1 AND v.shop_id = $2 AND v.status IN ('draft', 'in_review')`, [source.procedure_id, ctx.shopId]);
  const openDraft = () => conflict(`This procedure already has an open draft${open?.name ? ` started by ${String(open.name)}` : ''}. Publish or discard it in Drafting first, then make the draft from this proposal.`,
    { draftId: open?.id ?? null });
  if (open) throw openDraft();
  try {
    return await deps.sequelize.transaction(async (t) => {
      const v = await ProcedureVersion.create({
        shopId: ctx.shopId, procedureId: String(source.procedure_id), number: null, status: 'draft',
        document: draftDoc as unknown as Record<string, unknown>, lintReport: [...report.findings], basedOnId: String(source.id),
        createdBy: ctx.userId, updatedBy: ctx.userId, publishedBy: null, publishedAt: null, retiredAt: null,
      }, { transaction: t });
      await audit({ shopId: ctx.shopId, userId: ctx.userId, action: 'procedure.draft_from_advisor', entity: 'procedure_version', entityId: v.id,
        detail: { basedOn: source.id, order: body.order } }, t);
      return { draftId: v.id, procedureId: String(source.procedure_id), basedOnNumber: num(source.number), warnings: report.warningCount };
    });
  } catch (e) {
    if (e instanceof UniqueConstraintError) throw openDraft();
    throw e;
  }
}
