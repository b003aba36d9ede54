import { QUANTILE_DEFINITION } from '@shared/stats/quantile';
import { resolveLimits } from '@shared/measure/verdict';
import { recordedHandle } from '@shared/engine/kinds';
import type {
  BranchFigure, DiagnosisStatus, FindingsAnalytics, Quart, ReadingFigure, ReadingsAnalytics, StepFigure, StepsAnalytics, TimesAnalytics,
} from '@shared/stats/debrief-schema';
import { SCOPED, STEP_SCOPE, comebackDays, num, numOrNull, scopeBinds, type Scope, type Sql } from './debrief-scope';

// Debrief analytics, all aggregated in PostgreSQL over the scoped diagnoses (see SCOPED): only
// counts, shares and quantiles come back to Node, never the rows themselves.
// Quantiles: percentile_cont is the Hyndman & Fan (1996) type 7 sample quantile.

const STEPS_ON_PATH = `s AS (
  SELECT ds.diagnosis_id, ds.step_id, ds.band_id, ds.answer_id, ds.value, ds.verdict, ds.kind, ds.started_at, ds.answered_at,
    ds.dx_technician_id AS technician_id
  FROM diagnosis_steps ds WHERE ${STEP_SCOPE} AND NOT ds.superseded)`;

const quart = (r: Record<string, unknown>): Quart => {
  const q = (r.q as (number | string | null)[] | null) ?? [null, null, null];
  return { n: num(r.n), q1: numOrNull(q[0]), median: numOrNull(q[1]), q3: numOrNull(q[2]) };
};

/** Per step: how many diagnoses reached it and how many ended there; per branch: the share taken. */
export async function stepsAnalytics(sql: Sql, scope: Scope): Promise<StepsAnalytics> {
  const b = scopeBinds(scope);
  // One statement: the step rows are read once (materialised) and counted two ways.
  const [row] = await sql(`WITH ${SCOPED}, ${STEPS_ON_PATH.replace('s AS (', 's AS MATERIALIZED (')},
    reached AS (SELECT step_id, count(*) AS n FROM (
        SELECT diagnosis_id, step_id FROM s UNION SELECT id, ending_step_id FROM d WHERE ending_step_id IS NOT NULL) x
      GROUP BY step_id),
    ended AS (SELECT ending_step_id AS step_id, status, count(*) AS n FROM d GROUP BY 1, 2),
    branches AS (SELECT step_id, band_id, answer_id, count(*) AS n FROM s GROUP BY 1, 2, 3)
    SELECT (SELECT json_agg(x) FROM reached x) AS reached, (SELECT json_agg(x) FROM ended x) AS ended,
      (SELECT json_agg(x) FROM branches x) AS branches`, b);
  type Rec = Record<string, unknown>;
  const reached = (row?.reached ?? []) as Rec[];
  const ended = (row?.ended ?? []) as Rec[];
  const branches = (row?.branches ?? []) as Rec[];
  const total = ended.reduce((a, r) => a + num(r.n), 0);
  const figures = new Map<string, StepFigure>();
  const fig = (id: string) => figures.get(id) ?? figures.set(id, { stepId: id, reached: 0, finished: 0, handedOff: 0, abandoned: 0, active: 0 }).get(id)!;
  for (const r of reached) fig(String(r.step_id)).reached = num(r.n);
  const key: Record<string, keyof StepFigure> = { finished: 'finished', handed_off: 'handedOff', abandoned: 'abandoned' };
  for (const r of ended.filter((e) => e.step_id !== null && e.status !== 'active')) (fig(String(r.step_id)) as unknown as Record<string, number>)[key[String(r.status)]!] = num(r.n);
  const perStep = new Map<string, number>();
  for (const r of branches) perStep.set(String(r.step_id), (perStep.get(String(r.step_id)) ?? 0) + num(r.n));
  const branchFigures: BranchFigure[] = branches.map((r) => ({
    from: String(r.step_id), handle: recordedHandle(r.band_id, r.answer_id), count: num(r.n), share: num(r.n) / perStep.get(String(r.step_id))!,
  }));
  return { diagnoses: total, steps: [...figures.values()], branches: branchFigures };
}

/** Share of each ending, and first-time fix: finished with no comeback of the vehicle within N days. */
export async function findingsAnalytics(sql: Sql, scope: Scope): Promise<FindingsAnalytics> {
  const days = await comebackDays(sql, scope.shopId);
  const b = scopeBinds(scope);
  const [endings, [ftf]] = await Promise.all([
    sql(`WITH ${SCOPED} SELECT ending_step_id AS step_id, status, count(*) AS n FROM d
      WHERE status <> 'active' AND ending_step_id IS NOT NULL GROUP BY 1, 2 ORDER BY n DESC, 1`, b),
    sql(`WITH ${SCOPED} SELECT count(*) AS finished, count(*) FILTER (WHERE EXISTS (
        SELECT 1 FROM diagnoses c WHERE c.shop_id = $1 AND c.vehicle_id = d.vehicle_id
          AND c.started_at > d.ended_at AND c.started_at <= d.ended_at + make_interval(days => $5::int))) AS comebacks
      FROM d WHERE status = 'finished'`, [...b, days]),
  ]);
  const ended = endings.reduce((a, r) => a + num(r.n), 0);
  const finished = num(ftf?.finished);
  const comebacks = num(ftf?.comebacks);
  return {
    ended,
    endings: endings.map((r) => ({ stepId: String(r.step_id), status: r.status as DiagnosisStatus, count: num(r.n), share: num(r.n) / ended })),
    firstTimeFix: { finished, comebacks, rate: finished ? (finished - comebacks) / finished : null, comebackDays: days },
  };
}

const BINS = 20;

/**
 * Per Reading step: a histogram against the limits, the borderline share and values by technician,
 * in one statement: the reading rows are read once (materialised) and grouped three ways. The bins
 * span the values and the step's limits (as shared/stats/histogram.ts binSpec does).
 */
export async function readingsAnalytics(sql: Sql, scope: Scope): Promise<ReadingsAnalytics> {
  const steps = new Map(scope.doc.steps.map((s) => [s.id, s] as const));
  const limited = scope.doc.steps.flatMap((s) => (s.kind === 'reading' && s.limits ? [{ id: s.id, ...resolveLimits(s.limits) }] : []));
  const [row] = await sql(`WITH ${STEPS_ON_PATH},
    r AS MATERIALIZED (SELECT step_id, value, verdict, technician_id FROM s WHERE kind = 'reading' AND value IS NOT NULL),
    lim AS (SELECT * FROM unnest($5::text[], $6::float8[], $7::float8[]) AS t(step_id, lmin, lmax)),
    raw AS (SELECT r.step_id, LEAST(min(r.value), min(lim.lmin)) AS lo, GREATEST(max(r.value), max(lim.lmax)) AS hi
      FROM r LEFT JOIN lim ON lim.step_id = r.step_id GROUP BY r.step_id),
    spec AS (SELECT step_id,
      CASE WHEN hi > lo THEN lo ELSE lo - COALESCE(NULLIF(abs(lo) * 0.05, 0), 1) END AS lo,
      CASE WHEN hi > lo THEN hi ELSE hi + COALESCE(NULLIF(abs(lo) * 0.05, 0), 1) END AS hi FROM raw),
    tech AS (SELECT r.step_id, r.technician_id, count(*) AS n,
      count(*) FILTER (WHERE verdict IN ('borderline-low', 'borderline-high')) AS borderline,
      percentile_cont(ARRAY[0.25, 0.5, 0.75]) WITHIN GROUP (ORDER BY value) AS q FROM r GROUP BY 1, 2),
    binned AS (SELECT r.step_id, LEAST(GREATEST(width_bucket(r.value, spec.lo, spec.hi, ${BINS}), 1), ${BINS}) AS bin, count(*) AS n
      FROM r JOIN spec ON spec.step_id = r.step_id GROUP BY 1, 2)
    SELECT (SELECT json_agg(x) FROM spec x) AS specs, (SELECT json_agg(x) FROM binned x) AS bins,
      (SELECT json_agg(t ORDER BY t.step_id, t.name) FROM (SELECT tech.*, u.name FROM tech JOIN users u ON u.id = tech.technician_id) t) AS techs`,
  [...scopeBinds(scope), limited.map((l) => l.id), limited.map((l) => l.min ?? null), limited.map((l) => l.max ?? null)]);
  type Rec = Record<string, unknown>;
  const specs = (row?.specs ?? []) as Rec[];
  const bins = (row?.bins ?? []) as Rec[];
  const techs = (row?.techs ?? []) as Rec[];
  const out: ReadingFigure[] = specs.map((sp) => {
    const id = String(sp.step_id);
    const lo = num(sp.lo);
    const w = (num(sp.hi) - lo) / BINS;
    const counts = new Array<number>(BINS).fill(0);
    for (const b of bins) if (b.step_id === id) counts[num(b.bin) - 1] = num(b.n);
    const mine = techs.filter((t) => t.step_id === id);
    const n = mine.reduce((a, t) => a + num(t.n), 0);
    const borderline = mine.reduce((a, t) => a + num(t.borderline), 0);
    const step = steps.get(id);
    const reading = step?.kind === 'reading' ? step : null;
    return {
      stepId: id, quantity: reading?.quantity ?? null, unit: reading?.unit ?? null,
      limits: reading?.limits ? resolveLimits(reading.limits) : {}, n, borderline, borderlineShare: n ? borderline / n : null,
      bins: counts.map((count, i) => ({ lo: lo + i * w, hi: lo + (i + 1) * w, count })),
      byTechnician: mine.map((t) => ({ technicianId: String(t.technician_id), technicianName: String(t.name), borderline: num(t.borderline), ...quart(t) })),
    };
  });
  return { readings: out };
}

/** Median and quartiles (type 7) of seconds per step and per ended diagnosis. */
export async function timesAnalytics(sql: Sql, scope: Scope): Promise<TimesAnalytics> {
  const b = scopeBinds(scope);
  const [steps, [whole]] = await Promise.all([
    sql(`WITH ${STEPS_ON_PATH} SELECT step_id, count(*) AS n,
      percentile_cont(ARRAY[0.25, 0.5, 0.75]) WITHIN GROUP (ORDER BY date_part('epoch', answered_at - started_at)) AS q
      FROM s GROUP BY step_id`, b),
    sql(`WITH ${SCOPED} SELECT count(*) AS n,
      percentile_cont(ARRAY[0.25, 0.5, 0.75]) WITHIN GROUP (ORDER BY date_part('epoch', ended_at - started_at)) AS q
      FROM d WHERE status IN ('finished', 'handed_off') AND ended_at IS NOT NULL`, b),
  ]);
  return { definition: QUANTILE_DEFINITION, steps: steps.map((r) => ({ stepId: String(r.step_id), ...quart(r) })), diagnosis: quart(whole ?? {}) };
}
