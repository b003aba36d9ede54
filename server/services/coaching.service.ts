import type { ShopContext } from '../auth/context';
import { badRequest } from '../lib/errors';
import { demand } from '../auth/policy';
import type { CoachingNoteBody } from '@shared/stats/debrief-schema';
import { audit } from './audit';
import { findDiagnosisRow } from './debrief-diagnoses.service';
import { parseDocument, type Sql } from './debrief-scope';

export type { CoachingNoteDto } from '@shared/stats/debrief-answers';
import type { CoachingNoteDto } from '@shared/stats/debrief-answers';

export function noteDto(r: Record<string, unknown>): CoachingNoteDto {
  return {
    id: String(r.id), diagnosisId: String(r.diagnosis_id), stepId: (r.step_id as string | null) ?? null,
    authorName: String(r.author_name ?? 'A former member'), body: String(r.body), createdAt: new Date(r.created_at as string).toISOString(),
  };
}

/** The coaching notes of one diagnosis, oldest first. */
export async function notesOf(sql: Sql, shopId: string, diagnosisId: string): Promise<CoachingNoteDto[]> {
  const rows = await sql(
    `SELECT n.*, u.name AS author_name FROM coaching_notes n LEFT JOIN users u ON u.id = n.author_id
     WHERE n.shop_id = $1 AND n.diagnosis_id = $2 ORDER BY n.created_at, n.id`,
    [shopId, diagnosisId],
  );
  return rows.map(noteDto);
}

/**
 * A trainer's or lead's note on a whole diagnosis (no step) or on one step of its procedure.
 * The technician sees it in their own history.
 */
export async function addCoachingNote(sql: Sql, ctx: ShopContext, diagnosisId: string, input: CoachingNoteBody): Promise<CoachingNoteDto> {
  demand(ctx, 'coaching.write');
  const diagnosis = await findDiagnosisRow(sql, ctx, diagnosisId);
  const stepId = input.stepId ?? null;
  if (stepId !== null) {
    const [v] = await sql(`SELECT document FROM procedure_versions WHERE id = $1`, [diagnosis.versionId]);
    if (!parseDocument(v!.document).steps.some((s) => s.id === stepId)) {
      throw badRequest('That step is not part of the procedure this diagnosis ran. Pick a step from its timeline.', [{ path: 'stepId', message: 'Pick a step of this diagnosis' }]);
    }
  }
  const [row] = await sql(
    `INSERT INTO coaching_notes (shop_id, diagnosis_id, step_id, author_id, body) VALUES ($1, $2, $3, $4, $5)
     RETURNING *, (SELECT name FROM users WHERE id = $4) AS author_name`,
    [ctx.shopId, diagnosisId, stepId, ctx.userId, input.body],
  );
  await audit({ shopId: ctx.shopId, userId: ctx.userId, action: 'diagnosis.coaching_note_added', entity: 'diagnosis', entityId: diagnosisId, detail: { stepId } });
  return noteDto(row!);
}
