import type { ShopContext } from '../auth/context';
import { findDiagnosisRow } from './debrief-diagnoses.service';
import { notesOf } from './coaching.service';
import type { Replay, ReplayStep } from '@shared/stats/debrief-answers';
import type { StepShown } from '@shared/schema/bench';
import { parseDocument, type Sql } from './debrief-scope';

export type { ReplayStep, Replay } from '@shared/stats/debrief-answers';

const iso = (v: unknown) => new Date(v as string).toISOString();

/** Everything needed to replay one diagnosis beside its procedure graph. */
export async function replayDiagnosis(sql: Sql, ctx: ShopContext, id: string): Promise<Replay> {
  const row = await findDiagnosisRow(sql, ctx, id);
  const [[extra], [version], steps, photos, notes] = await Promise.all([
    sql(`SELECT complaint, conditions, outcome FROM diagnoses WHERE id = $1 AND shop_id = $2`, [id, ctx.shopId]),
    sql(`SELECT document FROM procedure_versions WHERE id = $1 AND shop_id = $2`, [row.versionId, ctx.shopId]),
    sql(`SELECT *, date_part('epoch', answered_at - started_at) AS seconds FROM diagnosis_steps
         WHERE diagnosis_id = $1 AND shop_id = $2 ORDER BY seq`, [id, ctx.shopId]),
    sql(`SELECT id, step_id, content_type, created_at FROM attachments WHERE diagnosis_id = $1 AND shop_id = $2 ORDER BY created_at`, [id, ctx.shopId]),
    notesOf(sql, ctx.shopId, id),
  ]);
  const timeline: ReplayStep[] = steps.map((s) => ({
    id: String(s.id), seq: Number(s.seq), stepId: String(s.step_id), kind: String(s.kind), shown: s.shown as StepShown,
    entered: (s.entered as string | null) ?? null, value: s.value === null ? null : Number(s.value), unit: (s.unit as string | null) ?? null,
    verdict: (s.verdict as string | null) ?? null, bandId: (s.band_id as string | null) ?? null, answerId: (s.answer_id as string | null) ?? null,
    superseded: Boolean(s.superseded), note: String(s.note ?? ''), startedAt: iso(s.started_at), answeredAt: iso(s.answered_at),
    seconds: Math.round(Number(s.seconds)),
  }));
  const path = timeline.filter((s) => !s.superseded).map((s) => s.stepId);
  if (row.endingStepId && path[path.length - 1] !== row.endingStepId) path.push(row.endingStepId);
  return {
    diagnosis: {
      ...row, complaint: String(extra?.complaint ?? ''), conditions: (extra?.conditions ?? {}) as Record<string, unknown>,
      outcome: (extra?.outcome ?? null) as Record<string, unknown> | null,
    },
    document: parseDocument(version!.document),
    steps: timeline,
    path,
    photos: photos.map((p) => ({ id: String(p.id), stepId: (p.step_id as string | null) ?? null, contentType: String(p.content_type), createdAt: iso(p.created_at) })),
    notes,
  };
}
