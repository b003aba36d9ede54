import { QueryTypes } from 'sequelize';
import type { AppDeps } from '../deps';
import type { ShopContext } from '../auth/context';
import { checkDiagnosis, diagnosisScope } from '../auth/policy';
import { AppError, notFound } from '../lib/errors';
import { Diagnosis, Meter, Vehicle } from '../models';
import { loadPinnedVersion } from './bench.service';
import { audit } from './audit';
import type { DiagnosisRecord, DiagnosisStatus, DiagnosisSummary, RecordStep, StartDiagnosisInput, StartDiagnosisResult } from '@shared/schema/bench';

/** Starts a diagnosis with the phone's id; sending the same start again answers the stored one. */
export async function startDiagnosis(deps: AppDeps, ctx: ShopContext, input: StartDiagnosisInput): Promise<StartDiagnosisResult> {
  const existing = await Diagnosis.findOne({ where: { id: input.id } });
  if (existing) {
    if (existing.shopId !== ctx.shopId || existing.technicianId !== ctx.userId || existing.procedureVersionId !== input.procedureVersionId) {
      throw new AppError(422, 'id_reused', 'A different diagnosis was already stored with this id. Start the diagnosis again from the Bench.');
    }
    return { created: false, id: existing.id };
  }
  const version = await loadPinnedVersion(deps.sequelize, ctx.shopId, input.procedureVersionId);
  const vehicle = await Vehicle.findOne({ where: { id: input.vehicleId, shopId: ctx.shopId } });
  if (!vehicle) throw notFound('That machine');
  if (input.meterId && !(await Meter.findOne({ where: { id: input.meterId, shopId: ctx.shopId } }))) throw notFound('That meter');
  await deps.sequelize.transaction(async (transaction) => {
    await Diagnosis.create({
      id: input.id, shopId: ctx.shopId, procedureVersionId: version.id, vehicleId: vehicle.id, technicianId: ctx.userId,
      meterId: input.meterId, complaint: input.complaint, conditions: input.conditions, endingStepId: null, outcome: null,
      endedAt: null, startedAt: new Date(input.startedAt),
    }, { transaction });
    // Pins every other version the walk may run (its "Continue in" steps), beside its own.
    for (const linkedId of version.linkedVersionIds) {
      await deps.sequelize.query('INSERT INTO diagnosis_linked_versions (diagnosis_id, procedure_version_id, shop_id) VALUES (:id, :linkedId, :shopId)',
        { replacements: { id: input.id, linkedId, shopId: ctx.shopId }, transaction });
    }
    await audit({ shopId: ctx.shopId, userId: ctx.userId, action: 'diagnosis.started', entity: 'diagnosis', entityId: input.id, detail: { versionId: version.id, linkedVersionIds: version.linkedVersionIds } }, transaction);
  });
  return { created: true, id: input.id };
}

const SUMMARY_SQL = `
  SELECT d.id, d.status, p.title AS procedure_title, p.slug AS procedure_slug, v.id AS version_id, v.number AS version_number,
         ve.label AS vehicle_label, ve.model AS vehicle_model, u.name AS technician_name, d.complaint,
         d.started_at, d.ended_at, d.last_activity_at, d.ending_step_id, d.technician_id,
         (SELECT count(*)::int FROM diagnosis_steps s WHERE s.diagnosis_id = d.id AND NOT s.superseded) AS steps_answered,
         -- the step waiting: where the latest answer routes ('' when it routes nowhere), or the start
         CASE WHEN d.status = 'active' THEN (
           SELECT st->>'title' FROM jsonb_array_elements(v.document->'steps') st
            WHERE st->>'id' = COALESCE((SELECT COALESCE(s.next_step_id, '') FROM diagnosis_steps s
                                         WHERE s.diagnosis_id = d.id AND NOT s.superseded ORDER BY s.seq DESC LIMIT 1),
                                       v.document->>'start')
            LIMIT 1) END AS current_step_title
    FROM diagnoses d
    JOIN procedure_versions v ON v.id = d.procedure_version_id
    JOIN procedures p ON p.id = v.procedure_id
    JOIN vehicles ve ON ve.id = d.vehicle_id
    JOIN users u ON u.id = d.technician_id
   WHERE d.shop_id = :shopId`;

interface SummaryRow {
  id: string; status: DiagnosisStatus; procedure_title: string; procedure_slug: string; version_id: string; version_number: number;
  vehicle_label: string; vehicle_model: string; technician_name: string; complaint: string; started_at: Date; ended_at: Date | null;
  last_activity_at: Date; ending_step_id: string | null; technician_id: string; steps_answered: number;
  current_step_title: string | null;
}

const iso = (d: Date | null) => (d ? new Date(d).toISOString() : null);

function toSummary(r: SummaryRow): DiagnosisSummary {
  return {
    id: r.id, status: r.status, procedureTitle: r.procedure_title, procedureSlug: r.procedure_slug, versionId: r.version_id,
    versionNumber: r.version_number, vehicleLabel: r.vehicle_label, vehicleModel: r.vehicle_model, technicianName: r.technician_name,
    complaint: r.complaint, startedAt: iso(r.started_at)!, endedAt: iso(r.ended_at), lastActivityAt: iso(r.last_activity_at)!,
    stepsAnswered: r.steps_answered, endingStepId: r.ending_step_id, currentStepTitle: r.current_step_title,
  };
}

/** The technician's own diagnoses (or, for leads and trainers asking for all, the shop's), newest first. */
export async function listDiagnoses(deps: AppDeps, ctx: ShopContext, q: { status?: string | undefined; mine: '0' | '1' }): Promise<DiagnosisSummary[]> {
  const mine = q.mine === '1' || diagnosisScope(ctx).ownOnly !== null;
  const rows = await deps.sequelize.query<SummaryRow>(
    `${SUMMARY_SQL} ${mine ? 'AND d.technician_id = :userId' : ''} ${q.status ? 'AND d.status = :status' : ''}
     ORDER BY d.last_activity_at DESC LIMIT 200`,
    { replacements: { shopId: ctx.shopId, userId: ctx.userId, status: q.status ?? null }, type: QueryTypes.SELECT },
  );
  return rows.map(toSummary);
}

/** One diagnosis the caller may read (own, or any for leads and trainers); otherwise a 404. */
type RecordRow = SummaryRow & {
  conditions: DiagnosisRecord['conditions']; outcome: DiagnosisRecord['outcome']; meter_name: string | null; meter_entries: DiagnosisRecord['meterEntries'] | null;
  vehicle_frame: string; vehicle_hours: string | null;
};

export async function findReadable(deps: AppDeps, ctx: ShopContext, id: string): Promise<RecordRow> {
  const rows = await deps.sequelize.query<RecordRow>(
    SUMMARY_SQL.replace('FROM diagnoses d', `, d.conditions, d.outcome, m.name AS meter_name, m.spec->'entries' AS meter_entries, ve.frame_number AS vehicle_frame,
      ve.hours AS vehicle_hours FROM diagnoses d LEFT JOIN meters m ON m.id = d.meter_id`)
      + ' AND d.id = :id',
    { replacements: { shopId: ctx.shopId, id }, type: QueryTypes.SELECT },
  );
  const row = rows[0];
  if (!row) throw notFound('That diagnosis');
  checkDiagnosis(ctx, row.technician_id, 'read');
  return row;
}

/**
 * The complete record: every answer (superseded ones too), photos and coaching notes. The rows'
 * timestamps come out of node-postgres as Dates; JSON sends them as the ISO strings the shared
 * shape names (tests/server/bench-contract.test.ts parses the answer).
 */
export async function getRecord(deps: AppDeps, ctx: ShopContext, id: string): Promise<DiagnosisRecord> {
  const d = await findReadable(deps, ctx, id);
  const [steps, attachments, coaching] = await Promise.all([
    deps.sequelize.query<RecordStep>(
      `SELECT id, seq, step_id AS "stepId", kind, shown, entered, value, unit, verdict, band_id AS "bandId", answer_id AS "answerId",
              superseded, note, started_at AS "startedAt", answered_at AS "answeredAt", next_step_id AS "next"
         FROM diagnosis_steps WHERE diagnosis_id = :id AND shop_id = :shopId ORDER BY seq`,
      { replacements: { id, shopId: ctx.shopId }, type: QueryTypes.SELECT }),
    deps.sequelize.query<DiagnosisRecord['attachments'][number]>(
      `SELECT id, step_id AS "stepId", content_type AS "contentType", byte_size AS "byteSize", original_name AS "originalName",
              thumb_key IS NOT NULL AS "hasThumb", created_at AS "createdAt"
         FROM attachments WHERE diagnosis_id = :id AND shop_id = :shopId ORDER BY created_at`,
      { replacements: { id, shopId: ctx.shopId }, type: QueryTypes.SELECT }),
    deps.sequelize.query<DiagnosisRecord['coachingNotes'][number]>(
      `SELECT c.id, c.step_id AS "stepId", c.body, u.name AS "authorName", c.created_at AS "createdAt"
         FROM coaching_notes c LEFT JOIN users u ON u.id = c.author_id
        WHERE c.diagnosis_id = :id AND c.shop_id = :shopId ORDER BY c.created_at`,
      { replacements: { id, shopId: ctx.shopId }, type: QueryTypes.SELECT }),
  ]);
  return {
    ...toSummary(d), conditions: d.conditions, outcome: d.outcome, meterName: d.meter_name, meterEntries: d.meter_entries ?? [],
    vehicleFrameNumber: d.vehicle_frame, vehicleHours: d.vehicle_hours === null ? null : Number(d.vehicle_hours),
    steps, attachments, coachingNotes: coaching,
  };
}
