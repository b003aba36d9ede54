import { createHash } from 'node:crypto';
import { LRUCache } from 'lru-cache';
import type { AppDeps } from '../deps';
import type { ShopContext } from '../auth/context';
import { checkDiagnosis } from '../auth/policy';
import { AppError, notFound } from '../lib/errors';
import { parseInput } from '../lib/validate';
import { loadPinnedVersion } from './bench.service';
import { decideStep, withMeter, type MeterEntry, type PathRow } from './diagnosis-decide';
import type { ProcedureWalk } from '@shared/engine/walk';
import { FindingOutcomeInput, HandoffOutcomeInput, type DiagnosisStatus, type DiagnosisStepInput, type StepResult } from '@shared/schema/bench';
import { unknownKind } from '@shared/engine/kinds';
import type { Step } from '@shared/schema/procedure';
import { notifyHandoff } from './report.service';

interface Head {
  status: DiagnosisStatus; technician_id: string; procedure_version_id: string; max_seq: number;
  meter: MeterEntry[] | null;
  path: PathRow[];
  /** Kept in memory only: the walk over exactly `path`, so the next answer is not a replay. */
  walk?: ProcedureWalk | undefined;
  existing: { diagnosis_id: string; payload_hash: string; seq: number; step_id: string; value: number | null; verdict: StepResult['verdict']; band_id: string | null; answer_id: string | null; next_step_id: string | null } | null;
}

/** sha256 over the input with sorted keys, so a retried message hashes the same. */
export function payloadHash(input: unknown): string {
  const canonical = JSON.stringify(input, (_k, v: unknown) =>
    v && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v).sort(([a], [b]) => a.localeCompare(b))) : v);
  return createHash('sha256').update(canonical).digest('hex');
}

// One statement reads everything the decision needs. It takes no lock: the write below is one
// atomic statement, and every change to a path is an insert at max(seq) + 1 (superseding rides
// along), so the unique (diagnosis_id, seq) index turns any change since this read into a
// conflict; the step is then decided again on a fresh read, so seq stays dense and the path true.
const HEAD_SQL = `
  SELECT d.status, d.technician_id, d.procedure_version_id, m.spec->'entries' AS meter,
    (SELECT coalesce(max(seq), 0) FROM diagnosis_steps WHERE diagnosis_id = d.id) AS max_seq,
    (SELECT coalesce(json_agg(json_build_object('id', s.id, 'seq', s.seq, 'stepId', s.step_id, 'next', s.next_step_id, 'entered', s.entered,
        'lead', s.shown->>'leadEntered', 'answerId', s.answer_id, 'acknowledged', coalesce((s.shown->>'acknowledged')::boolean, false)) ORDER BY s.seq), '[]')
       FROM diagnosis_steps s WHERE s.diagnosis_id = d.id AND NOT s.superseded) AS path,
    (SELECT row_to_json(x) FROM (SELECT diagnosis_id, payload_hash, seq, step_id, value, verdict, band_id, answer_id, next_step_id
       FROM diagnosis_steps WHERE id = $3::uuid) x) AS existing
  FROM diagnoses d LEFT JOIN meters m ON m.id = d.meter_id
  WHERE d.id = $1::uuid AND d.shop_id = $2::uuid`;

/**
 * Stores the step once and, when the step ends the diagnosis or its last activity is a minute
 * old, updates the diagnosis, in one statement (so one transaction); nothing is written once the
 * diagnosis has ended. Last activity to the minute is plenty for the abandon sweep (hours) and the
 * lists, and spares a row version per step. Two shapes: going back first supersedes the tail of
 * the path from seq $22; answering the step the path stands at (nearly every request) has no such
 * part, so PostgreSQL keeps one generic plan for it instead of planning each execution.
 */
function writeSql(goingBack: boolean): string {
  return `
  WITH live AS (
    SELECT procedure_version_id, started_at, technician_id FROM diagnoses
     WHERE id = $3::uuid AND status = 'active'
  ), ${goingBack ? `sup AS (
    UPDATE diagnosis_steps SET superseded = true
     WHERE diagnosis_id = $3::uuid AND seq >= $22::int AND NOT superseded AND EXISTS (SELECT 1 FROM live)
       -- a step sent again to a server whose remembered path already holds it is no going back
       AND NOT EXISTS (SELECT 1 FROM diagnosis_steps WHERE id = $1::uuid)
  ), ` : ''}ins AS (
    INSERT INTO diagnosis_steps (id, shop_id, diagnosis_id, seq, step_id, kind, shown, entered, value, unit, verdict,
                                 band_id, answer_id, note, started_at, answered_at, payload_hash, next_step_id,
                                 dx_version_id, dx_started_at, dx_technician_id)
    SELECT $1::uuid, $2::uuid, $3::uuid, $4::int, $5::text, $6::text, $7::jsonb, $8::text, $9::float8, $10::text, $11::text,
           $12::text, $13::text, $14::text, $15::timestamptz, $16::timestamptz, $17::text, $18::text,
           live.procedure_version_id, live.started_at, live.technician_id
      FROM live
    ON CONFLICT (id) DO NOTHING
    RETURNING id
  ), touched AS (
    UPDATE diagnoses SET last_activity_at = now(), updated_at = now(),
           status = coalesce($19::text, status), ending_step_id = coalesce($20::text, ending_step_id),
           outcome = coalesce($21::jsonb, outcome), ended_at = CASE WHEN $19::text IS NULL THEN ended_at ELSE $16::timestamptz END
     WHERE id = $3::uuid AND EXISTS (SELECT 1 FROM ins)
       AND ($19::text IS NOT NULL OR last_activity_at < now() - interval '1 minute')
  )
  SELECT count(*)::int AS inserted FROM ins`;
}
const WRITE_SQL = { forward: writeSql(false), back: writeSql(true) };

interface PgClient { query<R>(q: { name: string; text: string; values: unknown[] }): Promise<{ rows: R[] }> }

/**
 * Runs named prepared statements on a connection of Sequelize's pool: PostgreSQL plans each
 * statement once per connection instead of once per step (the step endpoint is the hot path).
 */
async function onPooledClient<T>(deps: AppDeps, fn: (client: PgClient) => Promise<T>): Promise<T> {
  const manager = deps.sequelize.connectionManager;
  const client = (await manager.getConnection({ type: 'write' })) as unknown as PgClient;
  try {
    return await fn(client);
  } finally {
    manager.releaseConnection(client as never);
  }
}

function fromExisting(e: NonNullable<Head['existing']>, id: string, status: DiagnosisStatus): StepResult {
  return { id, seq: e.seq, stepId: e.step_id, value: e.value, verdict: e.verdict, bandId: e.band_id, answerId: e.answer_id, next: e.next_step_id, status, duplicate: true };
}

function checkActive(head: Head): void {
  if (head.status !== 'active') {
    throw new AppError(409, 'diagnosis_ended', 'This diagnosis has already ended, so no more steps can be added. Start a new diagnosis for further work.');
  }
}

/** The stored path up to the row the new step follows (none for the start). */
function keptPath(path: readonly PathRow[], after: string | null): PathRow[] {
  if (after === null) return [];
  const i = path.findIndex((r) => r.id === after);
  if (i < 0) {
    throw new AppError(422, 'not_on_path', 'The step this answer follows is not on the current path of the diagnosis (it was changed or never sent). Reload the diagnosis and answer again.');
  }
  return path.slice(0, i + 1);
}

/** What ending the step records: a Finding's or Hand-off's outcome, parsed; nothing for other kinds. */
function outcomeFor(step: Step, input: DiagnosisStepInput): { endStatus: DiagnosisStatus | null; outcome: string | null } {
  switch (step.kind) {
    case 'finding': return { endStatus: 'finished', outcome: JSON.stringify(parseInput(FindingOutcomeInput, input.outcome ?? {}, 'The finding')) };
    case 'handoff': return { endStatus: 'handed_off', outcome: JSON.stringify(parseInput(HandoffOutcomeInput, input.outcome ?? {}, 'The hand-off')) };
    case 'reading': case 'observation': case 'task': case 'formula': case 'link': return { endStatus: null, outcome: null };
    default: return unknownKind(step);
  }
}

async function decideAndWrite(deps: AppDeps, ctx: ShopContext, diagnosisId: string, input: DiagnosisStepInput, head: Head, hash: string) {
  const version = await loadPinnedVersion(deps.sequelize, ctx.shopId, head.procedure_version_id);
  const step = version.steps.get(input.stepId);
  if (!step) {
    throw new AppError(422, 'unknown_step', `Step "${input.stepId}" is not part of version ${version.number} of "${version.title}", which this diagnosis follows. Reload the diagnosis.`);
  }
  const keep = keptPath(head.path, input.after);
  const prior = keep.length === head.path.length ? head.walk : undefined;
  const { decided, walk } = decideStep(prior?.doc ?? withMeter(version.document, head.meter ?? []), version.steps, keep, input, prior);
  const { endStatus, outcome } = outcomeFor(step, input);
  const seq = Number(head.max_seq) + 1;
  const goingBack = keep.length < head.path.length;
  const { rows: [written] } = await onPooledClient(deps, (c) => c.query<{ inserted: number }>({
    name: goingBack ? 'bench-step-write-back' : 'bench-step-write', text: goingBack ? WRITE_SQL.back : WRITE_SQL.forward,
    values: [
      input.id, ctx.shopId, diagnosisId, seq, step.id, step.kind, JSON.stringify(decided.shown), decided.entered, decided.value,
      decided.unit, decided.verdict, decided.bandId, decided.answerId, input.note, input.startedAt, input.answeredAt, hash, decided.next,
      endStatus, endStatus ? step.id : null, outcome,
      ...(goingBack ? [head.path[keep.length]!.seq] : []),
    ],
  }));
  // Nothing stored: the diagnosis ended, or the same id arrived at the same moment. Read again.
  if (!written || written.inserted === 0) return null;
  const result: StepResult = {
    id: input.id, seq, stepId: step.id, value: decided.value, verdict: decided.verdict, bandId: decided.bandId,
    answerId: decided.answerId, next: decided.next, status: endStatus ?? 'active', duplicate: false,
  };
  const row: PathRow = {
    id: input.id, seq, stepId: step.id, next: decided.next, entered: decided.entered,
    lead: input.leadEntered || null, answerId: decided.answerId, acknowledged: input.acknowledged,
  };
  const after: Head = { ...head, status: result.status, max_seq: seq, path: [...keep, row], walk, existing: null };
  return { result, after, handoff: step.kind === 'handoff' };
}

/**
 * The head of each diagnosis being stepped in this process, as it stood after its last write here:
 * the next step skips the read. A head gone stale (a step recorded by another server makes the
 * seq conflict; the abandon sweep fails the write's status check) only costs a fresh read.
 * Bounded by the answered steps held (a walk keeps each step's reading and decision: some 350
 * bytes as JSON, measured on the demo "No spark"): the least recently stepped make way first.
 */
const heads = new LRUCache<string, { shopId: string; head: Head }>({
  maxSize: 40_000, sizeCalculation: (v) => v.head.path.length + 1, ttl: 15 * 60_000,
});

function rememberHead(diagnosisId: string, shopId: string, head: Head): void {
  if (head.status === 'active') heads.set(diagnosisId, { shopId, head: { ...head, existing: null } });
  else heads.delete(diagnosisId);
}

async function readHead(deps: AppDeps, ctx: ShopContext, diagnosisId: string, stepRowId: string, attempt: number): Promise<{ head: Head | undefined; cached: boolean }> {
  const known = attempt === 0 ? heads.get(diagnosisId) : undefined;
  if (known && known.shopId === ctx.shopId) return { head: known.head, cached: true };
  const { rows: [head] } = await onPooledClient(deps, (c) => c.query<Head>({ name: 'bench-step-head', text: HEAD_SQL, values: [diagnosisId, ctx.shopId, stepRowId] }));
  return { head, cached: false };
}

const isSeqConflict = (e: unknown) => (e as { code?: string; constraint?: string }).code === '23505'
  && (e as { constraint?: string }).constraint === 'diagnosis_steps_diagnosis_seq_key';

/**
 * Records one answered step: re-checked against the pinned version, stored exactly once (the
 * phone's id is the primary key), earlier answers after `after` marked superseded. One read and
 * one atomic write; a query-count test and the benchmark hold it to that.
 */
export async function recordStep(deps: AppDeps, ctx: ShopContext, diagnosisId: string, input: DiagnosisStepInput): Promise<StepResult> {
  const hash = payloadHash(input);
  for (let attempt = 0; attempt < 4; attempt++) {
    const { head, cached } = await readHead(deps, ctx, diagnosisId, input.id, attempt);
    if (!head) throw notFound('That diagnosis');
    checkDiagnosis(ctx, head.technician_id, 'write');
    if (head.existing) {
      if (head.existing.diagnosis_id !== diagnosisId || head.existing.payload_hash !== hash) {
        throw new AppError(422, 'id_reused', 'A different step was already stored with this id. The app makes a new id per answer; reload the diagnosis and answer again.');
      }
      return fromExisting(head.existing, input.id, head.status);
    }
    checkActive(head);
    let out: Awaited<ReturnType<typeof decideAndWrite>>;
    try {
      out = await decideAndWrite(deps, ctx, diagnosisId, input, head, hash);
    } catch (e) {
      heads.delete(diagnosisId);
      // Another answer took this place a moment ago, or the remembered head could not place a
      // repeated step: decide again on a fresh read, which also finds a step already stored.
      if (isSeqConflict(e) || (cached && e instanceof AppError)) continue;
      throw e;
    }
    if (!out) {
      heads.delete(diagnosisId);
      continue;
    }
    rememberHead(diagnosisId, ctx.shopId, out.after);
    if (out.handoff) await notifyHandoff(deps, ctx, diagnosisId);
    return out.result;
  }
  throw new AppError(409, 'busy', 'Several answers reached this diagnosis at the same moment. Send the step again.');
}
