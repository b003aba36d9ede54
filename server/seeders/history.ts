import { randomUUID } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import { loadPinnedVersion } from '../services/bench.service';
import type { AppDeps } from '../deps';
import { hashPassword } from '../lib/passwords';
import { planWalks, rng, pick, walkTowardsFault, type Walk, type WalkedStep, type WalkPlan } from './history-walk';
import { insertRows } from './history-insert';
import { payloadHash } from '../services/diagnosis-step.service';

// Invented demo history over the published procedures of a shop: every name, reading and time
// here is made up for the demo. Every answer is decided by the live step code (history-walk.ts)
// and stored with the same columns; bulk inserts (unnest batches) make 100 000 diagnoses take minutes.

export interface HistoryOptions {
  diagnoses: number;
  /** Same seed, same history. */
  seed?: number;
  /** Spread over this many days before `now`. */
  days?: number;
  now?: Date;
  /** Diagnoses per insert batch. */
  batch?: number;
  log?: (msg: string) => void;
}

export interface HistoryResult { diagnoses: number; steps: number; vehicles: number; technicians: number }

interface Version { id: string; plan: WalkPlan }
interface Tech { id: string; speed: number; bias: number }

const APPRENTICES = [
  { email: 'apprentice.one@larkspur.test', name: 'Quinn Apprentice' },
  { email: 'apprentice.two@larkspur.test', name: 'Reese Apprentice' },
  { email: 'senior.tech@larkspur.test', name: 'Sage Senior' },
];
const FLEET = [
  { prefix: 'W', model: 'Wren 50 two-stroke scooter' },
  { prefix: 'B', model: 'Badger 110 youth quad' },
  { prefix: 'H', model: 'Heron 125 pit bike' },
];

async function loadVersions(deps: Pick<AppDeps, 'sequelize'>, shopId: string): Promise<Version[]> {
  const rows = await deps.sequelize.query<{ id: string }>(
    `SELECT id FROM procedure_versions WHERE shop_id = $1 AND status = 'published' ORDER BY created_at`,
    { bind: [shopId], type: QueryTypes.SELECT },
  );
  const versions: Version[] = [];
  for (const r of rows) {
    // Read as the step endpoint reads it (joined with the versions its links continue in), so both decide alike.
    const v = await loadPinnedVersion(deps.sequelize, shopId, r.id);
    versions.push({ id: r.id, plan: planWalks(v.document) });
  }
  return versions.filter((v) => v.plan.endings.length > 0); // a version with no reachable ending cannot be walked
}

/** The shop's technicians plus a few invented apprentices, each with their own pace and bias. */
async function technicians(deps: Pick<AppDeps, 'sequelize'>, shopId: string, t: Transaction): Promise<Tech[]> {
  const hash = await hashPassword(randomUUID());
  for (const a of APPRENTICES) {
    const [u] = await deps.sequelize.query<{ id: string }>(
      `INSERT INTO users (email, name, password_hash) VALUES ($1, $2, $3)
       ON CONFLICT (email) DO UPDATE SET email = EXCLUDED.email RETURNING id`,
      { bind: [a.email, a.name, hash], type: QueryTypes.SELECT, transaction: t },
    );
    await deps.sequelize.query(
      `INSERT INTO memberships (shop_id, user_id, roles) VALUES ($1, $2, ARRAY['technician']) ON CONFLICT DO NOTHING`,
      { bind: [shopId, u!.id], transaction: t },
    );
  }
  const rows = await deps.sequelize.query<{ user_id: string }>(
    `SELECT user_id FROM memberships WHERE shop_id = $1 AND 'technician' = ANY(roles) ORDER BY created_at, user_id`,
    { bind: [shopId], type: QueryTypes.SELECT, transaction: t },
  );
  // Demo paces and reading biases: one quick, one slow, one who reads a little high.
  const style = [{ speed: 1, bias: 1 }, { speed: 1.35, bias: 1 }, { speed: 1.1, bias: 1.04 }, { speed: 0.8, bias: 0.99 }];
  return rows.map((r, i) => ({ id: r.user_id, ...style[i % style.length]! }));
}

/** Enough fleet vehicles that a machine comes back a few times a year, not every week. */
async function vehicles(deps: Pick<AppDeps, 'sequelize'>, shopId: string, wanted: number, t: Transaction): Promise<string[]> {
  const have = await deps.sequelize.query<{ id: string }>(`SELECT id FROM vehicles WHERE shop_id = $1`, { bind: [shopId], type: QueryTypes.SELECT, transaction: t });
  const missing = Math.max(0, wanted - have.length);
  const labels = Array.from({ length: missing }, (_, i) => i);
  for (let i = 0; i < labels.length; i += 5000) {
    const chunk = labels.slice(i, i + 5000);
    await deps.sequelize.query(
      `INSERT INTO vehicles (shop_id, label, model) SELECT $1, l, m FROM unnest($2::text[], $3::text[]) AS t(l, m) ON CONFLICT DO NOTHING`,
      { bind: [shopId, chunk.map((k) => `${FLEET[k % 3]!.prefix}-R${String(k + 1).padStart(5, '0')}`), chunk.map((k) => FLEET[k % 3]!.model)], transaction: t },
    );
  }
  const all = await deps.sequelize.query<{ id: string }>(`SELECT id FROM vehicles WHERE shop_id = $1 ORDER BY label`, { bind: [shopId], type: QueryTypes.SELECT, transaction: t });
  return all.map((v) => v.id);
}

/** Visit times per vehicle: months apart, and now and then back within a few weeks (a comeback). */
export function scheduleVisits(count: number, vehicleIds: readonly string[], days: number, now: number, rand: () => number): { vehicleId: string; at: number }[] {
  const out: { vehicleId: string; at: number }[] = [];
  const day = 86_400_000;
  for (let v = 0; out.length < count; v = (v + 1) % vehicleIds.length) {
    let at = now - days * day + rand() * 90 * day;
    while (at < now - 3_600_000 && out.length < count) {
      out.push({ vehicleId: vehicleIds[v]!, at });
      at += rand() < 0.09 ? (2 + rand() * 20) * day : (45 + rand() * 120) * day;
    }
  }
  return out;
}


/**
 * A step row as the step endpoint writes it, from the same decision. The seeder leaves out the
 * step's long instructions and safety text (the pinned version holds them), which keeps a 100 000
 * diagnosis history to a sensible size; nothing Debrief reads depends on them.
 */
function stepRow(diagnosisId: string, seq: number, s: WalkedStep, started: number, answered: number): unknown[] {
  const { instructions: _i, safety: _s, ...shown } = s.decided.shown;
  const d = s.decided;
  const hash = payloadHash({ diagnosisId, seq, ...s.answer });
  return [randomUUID(), diagnosisId, seq, s.stepId, s.kind, JSON.stringify(shown), d.entered, d.value, d.unit, d.verdict,
    d.bandId, d.answerId, d.next, s.superseded, new Date(started).toISOString(), new Date(answered).toISOString(), hash];
}

function build(walk: Walk, version: Version, tech: Tech, vehicleId: string, at: number, rand: () => number, now: number): { d: unknown[]; s: unknown[][] } {
  const id = randomUUID();
  const steps: unknown[][] = [];
  let t = at;
  const abandonAt = rand() < 0.06 && walk.steps.length > 1 ? 1 + Math.floor(rand() * (walk.steps.length - 1)) : -1;
  const kept = abandonAt >= 0 || !walk.end ? walk.steps.slice(0, abandonAt >= 0 ? abandonAt : undefined) : walk.steps;
  for (const s of kept) {
    const started = t;
    t += s.seconds * 1000;
    steps.push(stepRow(id, steps.length + 1, s, started, t));
    t += (5 + rand() * 25) * 1000;
  }
  const ended = abandonAt < 0 && walk.end;
  if (ended) {
    // Bench records the ending too: the Finding or Hand-off screen answered with its outcome.
    const started = t;
    t += (30 + rand() * 90) * 1000;
    steps.push(stepRow(id, steps.length + 1, walk.end!, started, t));
  }
  const recent = now - at < 36 * 3_600_000;
  const status = !ended ? (recent ? 'active' : 'abandoned') : walk.ending === 'finding' ? 'finished' : 'handed_off';
  const ending = !ended ? (walk.steps[abandonAt]?.stepId ?? walk.endingStepId) : walk.endingStepId;
  const endedAt = status === 'finished' || status === 'handed_off' ? new Date(t).toISOString() : null;
  const outcome = status === 'finished' ? { labourMinutes: Math.round((t - at) / 60000) } : status === 'handed_off' ? { reason: 'Needs a senior technician' } : null;
  return {
    d: [id, version.id, vehicleId, tech.id, status, status === 'active' ? null : ending, outcome && JSON.stringify(outcome),
      new Date(at).toISOString(), endedAt, new Date(t).toISOString()],
    s: steps,
  };
}

/**
 * Generates `diagnoses` invented diagnoses over the shop's published procedures.
 * Example: `await seedHistory(deps, shopId, { diagnoses: 300, seed: 7 })`.
 */
export async function seedHistory(deps: Pick<AppDeps, 'sequelize'>, shopId: string, o: HistoryOptions): Promise<HistoryResult> {
  const versions = await loadVersions(deps, shopId);
  if (!versions.length) throw new Error('The shop has no published procedure to walk; seed the demo procedures first.');
  const rand = rng(o.seed ?? 1);
  const now = (o.now ?? new Date()).getTime();
  const { techs, vehicleIds } = await deps.sequelize.transaction(async (t) => ({
    techs: await technicians(deps, shopId, t),
    vehicleIds: await vehicles(deps, shopId, Math.max(7, Math.ceil(o.diagnoses / 3)), t),
  }));
  const visits = scheduleVisits(o.diagnoses, vehicleIds, o.days ?? 365, now, rand).sort((a, b) => a.at - b.at);
  const batch = o.batch ?? 2000;
  let steps = 0;
  for (let i = 0; i < visits.length; i += batch) {
    const built = visits.slice(i, i + batch).map((v) => {
      const version = pick(rand, versions);
      const tech = pick(rand, techs);
      const walk = walkTowardsFault(version.plan, { rand, speed: tech.speed, bias: tech.bias, takeBackChance: 0.06 });
      return build(walk, version, tech, v.vehicleId, v.at, rand, now);
    });
    const stepRows = built.flatMap((b) => b.s);
    await insertRows(deps, shopId, built.map((b) => b.d), stepRows);
    steps += stepRows.length;
    o.log?.(`[history] ${Math.min(i + batch, visits.length)} / ${visits.length} diagnoses, ${steps} steps`);
  }
  // Fresh statistics, and a visibility map so the covering indexes answer without the heap.
  await deps.sequelize.query('VACUUM ANALYZE diagnoses');
  await deps.sequelize.query('VACUUM ANALYZE diagnosis_steps');
  return { diagnoses: visits.length, steps, vehicles: vehicleIds.length, technicians: techs.length };
}

/**
 * Seeds `n` diagnoses when the shop has none yet and has published procedures; returns how many
 * were created (0 when it did nothing). Called at start-up so Debrief is never empty.
 * Example: `await seedHistoryIfEmpty(deps, shopId, 300)`.
 */
export async function seedHistoryIfEmpty(deps: Pick<AppDeps, 'sequelize'>, shopId: string, n: number): Promise<number> {
  const [row] = await deps.sequelize.query<{ diagnoses: number; published: number }>(
    `SELECT (SELECT count(*)::int FROM diagnoses WHERE shop_id = $1) AS diagnoses,
            (SELECT count(*)::int FROM procedure_versions WHERE shop_id = $1 AND status = 'published') AS published`,
    { bind: [shopId], type: QueryTypes.SELECT },
  );
  if (!row || row.diagnoses > 0 || row.published === 0) return 0;
  return (await seedHistory(deps, shopId, { diagnoses: n, seed: 2026 })).diagnoses;
}
