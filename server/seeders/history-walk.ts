import type { Band, ProcedureDocument, Step, StepId } from '@shared/schema/procedure';
import { branchesOf, isEnding, type Branch } from '@shared/schema/branches';
import { classify, meterUncertainty, resolveLimits, type Verdict } from '@shared/measure/verdict';
import { bandContains } from '@shared/measure/bands';

// Invented demo history: walks a published procedure towards a fault drawn from stated shares,
// with readings drawn around the limits. Nothing here is service data.

export { rng } from '@shared/stats/rng';

export function normal(rand: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
}

export function pick<T>(rand: () => number, xs: readonly T[]): T {
  return xs[Math.floor(rand() * xs.length)]!;
}

/** One answered step as the walk produced it. */
export interface WalkedStep {
  stepId: StepId;
  kind: Step['kind'];
  title: string;
  value: number | null;
  verdict: Verdict | null;
  bandId: string | null;
  answerId: string | null;
  nextStepId: StepId;
  superseded: boolean;
  seconds: number;
}

export interface Walk {
  steps: WalkedStep[];
  endingStepId: StepId;
  ending: 'finding' | 'handoff';
}

/** Precomputed per document: which endings each step can still reach, and the fault shares. */
export interface WalkPlan {
  doc: ProcedureDocument;
  byId: Map<StepId, Step>;
  reaches: Map<StepId, Set<StepId>>;
  /** Ending ids with their share of diagnoses (stated demo shares, adding up to 1). */
  endings: { id: StepId; share: number }[];
}

/**
 * Demo fault shares: the k-th Finding in document order weighs 1/k (a few common faults, a long
 * tail of rare ones), and Hand-offs share 8 % between them.
 */
export function planWalks(doc: ProcedureDocument): WalkPlan {
  const byId = new Map(doc.steps.map((s) => [s.id, s] as const));
  // Which endings each step can still reach: a backward search from every ending (exact with loops).
  const into = new Map<StepId, StepId[]>();
  for (const st of doc.steps) for (const b of branchesOf(st)) into.set(b.to, [...(into.get(b.to) ?? []), st.id]);
  const reaches = new Map<StepId, Set<StepId>>(doc.steps.map((st) => [st.id, new Set<StepId>()]));
  for (const ending of doc.steps.filter(isEnding)) {
    const queue = [ending.id];
    const seen = new Set(queue);
    while (queue.length) {
      const id = queue.pop()!;
      reaches.get(id)?.add(ending.id);
      for (const from of into.get(id) ?? []) if (!seen.has(from)) { seen.add(from); queue.push(from); }
    }
  }
  const reachable = reaches.get(doc.start) ?? new Set<StepId>();
  const findings = doc.steps.filter((s) => s.kind === 'finding' && reachable.has(s.id));
  const handoffs = doc.steps.filter((s) => s.kind === 'handoff' && reachable.has(s.id));
  const handoffShare = handoffs.length ? 0.08 : 0;
  const weights = findings.map((_, k) => 1 / (k + 1));
  const total = weights.reduce((a, b) => a + b, 0) || 1;
  const endings = [
    ...findings.map((s, k) => ({ id: s.id, share: ((1 - handoffShare) * weights[k]!) / total })),
    ...handoffs.map((s) => ({ id: s.id, share: handoffShare / handoffs.length })),
  ];
  return { doc, byId, reaches, endings };
}

function drawEnding(plan: WalkPlan, rand: () => number, among?: Set<StepId>): StepId {
  const within = among ? plan.endings.filter((e) => among.has(e.id)) : plan.endings;
  const options = within.length ? within : plan.endings;
  const total = options.reduce((a, e) => a + e.share, 0);
  let r = rand() * total;
  for (const e of options) if ((r -= e.share) <= 0) return e.id;
  return options[options.length - 1]!.id;
}

/** A value inside the band, drawn around its ends with noise so some sit near the limits. */
export function valueInBand(band: Pick<Band, 'lower' | 'upper'>, limits: { min?: number; max?: number }, rand: () => number): number {
  const lo = band.lower?.value;
  const hi = band.upper?.value;
  const span = Math.abs((limits.max ?? hi ?? lo ?? 1) - (limits.min ?? lo ?? hi ?? 0)) || Math.abs(lo ?? hi ?? 1) || 1;
  let v: number;
  if (lo !== undefined && hi !== undefined) v = (lo + hi) / 2 + normal(rand) * (hi - lo) / 4;
  else if (lo !== undefined) v = lo + Math.abs(normal(rand)) * span * 0.35;
  else if (hi !== undefined) v = hi - Math.abs(normal(rand)) * span * 0.35;
  else v = normal(rand) * span;
  if (hi !== undefined && hi > 0 && lo === undefined && v < 0) v = hi * rand();
  // Now and then a reading sits just inside a band end (a limit), where borderline verdicts live.
  const ends = [lo, hi].filter((e): e is number => e !== undefined);
  if (ends.length && rand() < 0.15) {
    const edge = pick(rand, ends);
    v = edge + (edge === lo ? 1 : -1) * Math.abs(span) * 0.02 * rand();
  }
  if (bandContains({ id: 'b', lower: band.lower, upper: band.upper }, v)) return v;
  if (lo !== undefined && hi !== undefined) return (lo + hi) / 2;
  return lo !== undefined ? lo + span * 0.1 : (hi ?? 0) - span * 0.1;
}

function stepSeconds(plan: WalkPlan, step: Step, rand: () => number, speed: number): number {
  const minutes = step.minutes ?? (step.kind === 'formula' ? 0 : plan.doc.meta.minutesPerStep);
  return Math.max(3, Math.round(minutes * 60 * speed * Math.exp(0.45 * normal(rand))));
}

interface Choice { branch: Branch; value: number | null; verdict: Verdict | null }

function choose(plan: WalkPlan, step: Step, target: StepId, rand: () => number, bias: number): Choice {
  const branches = branchesOf(step);
  const good = branches.filter((b) => b.kind !== 'borderline' && plan.reaches.get(b.to)?.has(target));
  const branch = pick(rand, good.length ? good : branches);
  if ((step.kind !== 'reading' && step.kind !== 'formula') || branch.kind !== 'band') return { branch, value: null, verdict: null };
  const band = step.bands.find((b) => `band:${b.id}` === branch.handle)!;
  const limits = step.limits ? resolveLimits(step.limits) : {};
  const value = valueInBand(band, limits, rand) * bias;
  const inBand = bandContains({ id: band.id, lower: band.lower, upper: band.upper }, value) ? value : value / bias;
  if (step.kind !== 'reading' || !step.limits) return { branch, value: inBand, verdict: null };
  const U = step.meter ? meterUncertainty(inBand, step.meter).expanded : 0;
  const { verdict } = classify(inBand, limits, U, step.decision);
  const borderline = branches.find((b) => b.kind === 'borderline');
  const isBorderline = verdict === 'borderline-low' || verdict === 'borderline-high';
  return { branch: isBorderline && borderline ? borderline : branch, value: inBand, verdict };
}

export interface WalkOptions {
  rand: () => number;
  /** Technician's pace: 1 is the estimate, 1.3 a third slower. */
  speed: number;
  /** Multiplies every reading (a technician who reads a little high or low). */
  bias: number;
  /** Chance of changing an earlier answer once on the way. */
  takeBackChance: number;
}

/** Walks the procedure from its start towards a drawn fault; at most 200 answered steps. */
export function walkTowardsFault(plan: WalkPlan, o: WalkOptions): Walk {
  let target = drawEnding(plan, o.rand);
  const steps: WalkedStep[] = [];
  let at = plan.doc.start;
  let takeBack = o.rand() < o.takeBackChance;
  for (let guard = 0; guard < 200; guard++) {
    const step = plan.byId.get(at)!;
    if (isEnding(step)) return { steps, endingStepId: at, ending: step.kind === 'finding' ? 'finding' : 'handoff' };
    const reach = plan.reaches.get(at);
    if (reach && !reach.has(target) && reach.size) target = drawEnding(plan, o.rand, reach);
    const c = choose(plan, step, target, o.rand, o.bias);
    const alternatives = branchesOf(step).filter((b) => b.to !== c.branch.to);
    if (takeBack && alternatives.length && o.rand() < 0.4) {
      takeBack = false;
      const wrong = pick(o.rand, alternatives);
      steps.push(walked(step, { ...c, branch: wrong }, stepSeconds(plan, step, o.rand, o.speed), true));
    }
    steps.push(walked(step, c, stepSeconds(plan, step, o.rand, o.speed), false));
    at = c.branch.to;
  }
  return { steps, endingStepId: at, ending: 'handoff' };
}

function walked(step: Step, c: Choice, seconds: number, superseded: boolean): WalkedStep {
  const handle = c.branch.handle;
  return {
    stepId: step.id,
    kind: step.kind,
    title: step.title,
    value: c.value,
    verdict: c.verdict,
    bandId: handle.startsWith('band:') ? handle.slice(5) : handle === 'borderline' ? 'borderline' : null,
    answerId: handle.startsWith('answer:') ? handle.slice(7) : null,
    nextStepId: c.branch.to,
    superseded,
    seconds,
  };
}
