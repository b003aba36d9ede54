import type { ShopContext } from '../auth/context';
import { notFound } from '../lib/errors';
import type { DiagnosisFilter, DiagnosisListQuery, DiagnosisPage, DiagnosisRow, DiagnosisStatus } from '@shared/stats/debrief-schema';
import { diagnosisScope } from '../auth/policy';
import { comebackDays, dayBounds, joinedDocument, num, type Sql } from './debrief-scope';

// The diagnoses table of Debrief: filtered, sorted and paged in SQL; flags computed per row.

const SORT_SQL: Record<DiagnosisListQuery['sort'], string> = {
  startedAt: 'd.started_at',
  duration: 'duration_seconds',
  status: 'd.status',
  procedure: 'p.title',
  vehicle: 'veh.label',
  technician: 'u.name',
};

// Each flag as a condition on a diagnoses row d; $2 is the shop's comeback window in days.
const FLAG_SQL: Record<NonNullable<DiagnosisFilter['flag']>, string> = {
  borderline: `EXISTS (SELECT 1 FROM diagnosis_steps b WHERE b.diagnosis_id = d.id AND b.verdict IN ('borderline-low', 'borderline-high'))`,
  'taken-back': `EXISTS (SELECT 1 FROM diagnosis_steps b WHERE b.diagnosis_id = d.id AND b.superseded)`,
  comeback: `(d.status <> 'active' AND EXISTS (SELECT 1 FROM diagnoses c WHERE c.shop_id = d.shop_id AND c.vehicle_id = d.vehicle_id
     AND c.started_at > COALESCE(d.ended_at, d.last_activity_at)
     AND c.started_at <= COALESCE(d.ended_at, d.last_activity_at) + make_interval(days => $2::int)))`,
};

const FLAGS_SQL = `${FLAG_SQL.borderline} AS f_borderline, ${FLAG_SQL['taken-back']} AS f_taken_back, ${FLAG_SQL.comeback} AS f_comeback`;

/** WHERE clause and binds; $1 is the shop and $2 the comeback days in every query built here. */
function where(ctx: ShopContext, f: DiagnosisFilter, days: number): { clause: string; bind: unknown[] } {
  const bind: unknown[] = [ctx.shopId, days];
  const parts = ['d.shop_id = $1'];
  const add = (sql: string, value: unknown) => { bind.push(value); parts.push(sql.replace('?', `$${bind.length}`)); };
  const { ownOnly } = diagnosisScope(ctx);
  if (ownOnly) add('d.technician_id = ?', ownOnly);
  if (f.procedureId) add('v.procedure_id = ?', f.procedureId);
  if (f.versionId) add('d.procedure_version_id = ?', f.versionId);
  if (f.status) add('d.status = ?', f.status);
  if (f.technicianId) add('d.technician_id = ?', f.technicianId);
  if (f.endingStepId) add('d.ending_step_id = ?', f.endingStepId);
  if (f.vehicle) {
    bind.push(`%${f.vehicle.replace(/[\\%_]/g, '\\$&')}%`);
    parts.push(`(veh.label ILIKE $${bind.length} OR veh.model ILIKE $${bind.length})`);
  }
  const [from, to] = dayBounds(f);
  if (f.from) add('d.started_at >= ?::timestamptz', from);
  if (f.to) add('d.started_at < ?::timestamptz', to);
  if (f.flag) parts.push(FLAG_SQL[f.flag]);
  return { clause: parts.join(' AND '), bind };
}

function baseSelect(clause: string, withFlags = true): string {
  return `SELECT d.id, d.shop_id, d.vehicle_id, d.last_activity_at, d.status, d.ending_step_id, d.started_at, d.ended_at, d.technician_id,
      d.procedure_version_id, v.procedure_id, v.number, p.title, veh.label, veh.model, u.name,
      date_part('epoch', COALESCE(d.ended_at, d.last_activity_at) - d.started_at) AS duration_seconds${withFlags ? `, ${FLAGS_SQL}` : ''}
    FROM diagnoses d
    JOIN procedure_versions v ON v.id = d.procedure_version_id
    JOIN procedures p ON p.id = v.procedure_id
    JOIN vehicles veh ON veh.id = d.vehicle_id
    JOIN users u ON u.id = d.technician_id
    WHERE ${clause}`;
}

type Titles = Map<string, Map<string, { title: string; kind: string }>>;

/** Step titles of the versions on a page, from their documents joined with what they link to (a handful of rows). */
async function stepTitles(sql: Sql, shopId: string, versionIds: string[]): Promise<Titles> {
  const out: Titles = new Map();
  for (const id of versionIds) {
    const doc = await joinedDocument(sql, shopId, id);
    out.set(id, new Map(doc.steps.map((s) => [s.id, { title: s.title, kind: s.kind }])));
  }
  return out;
}

function toRow(r: Record<string, unknown>, titles: Titles): DiagnosisRow {
  const ending = r.ending_step_id ? titles.get(String(r.procedure_version_id))?.get(String(r.ending_step_id)) : undefined;
  return {
    id: String(r.id), procedureId: String(r.procedure_id), procedureTitle: String(r.title),
    versionId: String(r.procedure_version_id), versionNumber: r.number === null ? null : Number(r.number),
    vehicleLabel: String(r.label), vehicleModel: String(r.model), technicianId: String(r.technician_id), technicianName: String(r.name),
    status: r.status as DiagnosisStatus, endingStepId: (r.ending_step_id as string | null) ?? null,
    endingTitle: ending?.title ?? null, endingKind: ending?.kind ?? null,
    startedAt: new Date(r.started_at as string).toISOString(), endedAt: r.ended_at ? new Date(r.ended_at as string).toISOString() : null,
    durationSeconds: Math.round(num(r.duration_seconds)),
    flags: { borderline: Boolean(r.f_borderline), takenBack: Boolean(r.f_taken_back), comeback: Boolean(r.f_comeback) },
  };
}

async function selectRows(sql: Sql, ctx: ShopContext, q: DiagnosisFilter & { sort?: DiagnosisListQuery['sort']; dir?: 'asc' | 'desc' }, tail: string, extra: unknown[] = []) {
  const days = await comebackDays(sql, ctx.shopId);
  const { clause, bind } = where(ctx, q, days);
  const order = `${SORT_SQL[q.sort ?? 'startedAt']} ${q.dir === 'asc' ? 'ASC' : 'DESC'}, id`;
  const paging = tail.replace(/\$P(\d)/g, (_, k: string) => `$${bind.length + Number(k)}`);
  const orderBy = order.replace(/^\w+\./, '');
  // Filter (a flag filter decides only its own flag per row), sort and page first; then work out
  // the three flags for the page's rows only.
  const rows = await sql(`SELECT d.*, ${FLAGS_SQL} FROM (${baseSelect(clause, false)} ORDER BY ${orderBy} ${paging}) d
      ORDER BY ${orderBy}`, [...bind, ...extra]);
  return { rows, days, clause, bind };
}

/** One page of the shop's diagnoses with the total of the filtered set. */
export async function listDiagnoses(sql: Sql, ctx: ShopContext, q: DiagnosisListQuery): Promise<DiagnosisPage> {
  const { rows, days, clause, bind } = await selectRows(sql, ctx, q, 'LIMIT $P1 OFFSET $P2', [q.pageSize, (q.page - 1) * q.pageSize]);
  const [count] = await sql(`SELECT count(*) AS n FROM diagnoses d JOIN procedure_versions v ON v.id = d.procedure_version_id
      JOIN vehicles veh ON veh.id = d.vehicle_id WHERE ${clause} AND $2::int > 0`, bind);
  const titles = await stepTitles(sql, ctx.shopId, [...new Set(rows.map((r) => String(r.procedure_version_id)))]);
  return { rows: rows.map((r) => toRow(r, titles)), total: num(count?.n), page: q.page, pageSize: q.pageSize, comebackDays: days };
}

const csvCell = (v: unknown): string => {
  const s = v === null || v === undefined ? '' : String(v);
  // A leading = + - @ would run as a formula in a spreadsheet (CSV injection); quote it as text.
  const safe = /^[=+\-@\t\r]/.test(s) ? `'${s}` : s;
  return /[",\n\r]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
};

/** The whole filtered set as CSV (at most 100 000 rows), same order as the table. */
export async function diagnosesCsv(sql: Sql, ctx: ShopContext, q: DiagnosisListQuery): Promise<string> {
  const { rows } = await selectRows(sql, ctx, q, 'LIMIT 100000');
  const titles = await stepTitles(sql, ctx.shopId, [...new Set(rows.map((r) => String(r.procedure_version_id)))]);
  const head = ['id', 'procedure', 'version', 'vehicle', 'model', 'technician', 'status', 'ending step', 'ended at step', 'started (UTC)',
    'ended (UTC)', 'duration (min)', 'borderline on the way', 'step taken back', 'came back'];
  const lines = rows.map((r) => toRow(r, titles)).map((d) => [d.id, d.procedureTitle, d.versionNumber, d.vehicleLabel, d.vehicleModel,
    d.technicianName, d.status, d.endingStepId, d.endingTitle, d.startedAt, d.endedAt, (d.durationSeconds / 60).toFixed(1),
    d.flags.borderline ? 'yes' : 'no', d.flags.takenBack ? 'yes' : 'no', d.flags.comeback ? 'yes' : 'no'].map(csvCell).join(','));
  return [head.join(','), ...lines].join('\r\n') + '\r\n';
}

/** A diagnosis of the shop the caller may read (a technician only their own), else 404. */
export async function findDiagnosisRow(sql: Sql, ctx: ShopContext, id: string): Promise<DiagnosisRow> {
  const days = await comebackDays(sql, ctx.shopId);
  const { clause, bind } = where(ctx, {}, days);
  const [row] = await sql(`${baseSelect(`${clause} AND d.id = $${bind.length + 1}`)}`, [...bind, id]);
  if (!row) throw notFound('That diagnosis');
  return toRow(row, await stepTitles(sql, ctx.shopId, [String(row.procedure_version_id)]));
}
