import type { Band, ProcedureDocument, Step, StepId } from '@shared/schema/procedure';
import { STEP_TRAITS, branchesOf, isEnding, type Branch } from '@shared/engine/kinds';
import { resolveLimits } from '@shared/measure/verdict';
import { bandContains } from '@shared/measure/bands';
import { formatReading } from '@shared/measure/format';
import type { ProcedureWalk } from '@shared/engine/walk';
import { AppError } from '../lib/errors';
import { decideStep, type DecidedStep, type PathRow, type StepAnswer } from '../services/diagnosis-decide';

// Invented demo history: walks a published procedure towards a fault drawn from stated shares,
// with readings drawn around the limits, each answer decided by the live step code. Nothing here
// is service data.

export { rng } from '@shared/stats/rng';

export function normal(rand: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
}

export function pick<T>(rand: () => number, xs: readonly T[]): T {
  return xs[Math.floor(rand() * xs.length)]!;
}

/** One answered step: the answer the invented technician gave, decided as the live endpoint decides it. */
export interface WalkedStep {
  stepId: StepId;
  kind: Step['kind'];
  decided: DecidedStep;
  /** What the phone would have sent (hashed for the record's payload_hash). */
  answer: StepAnswer;
  superseded: boolean;
  seconds: number;
}

export interface Walk {
  /** Answered steps before the ending, superseded ones included, in the order they happened. */
  steps: WalkedStep[];
  /** The Finding or Hand-off the walk reached, decided like the others. */
  end: WalkedStep | null;
  endingStepId: StepId;
  ending: 'finding' | 'handoff';
}

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
  else {
    // A band with no ends: around the limit, and never below zero when the limit is not.
    const mid = limits.min ?? limits.max ?? 0;
    v = mid + normal(rand) * span * 0.5;
    if (mid >= 0 && v < 0) v = -v;
  }
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
  const minutes = step.minutes ?? (STEP_TRAITS[step.kind].takesTime ? plan.doc.meta.minutesPerStep : 0);
  return Math.max(3, Math.round(minutes * 60 * speed * Math.exp(0.45 * normal(rand))));
}

/** The branch towards the target ending that the invented technician means to take. */
function aim(plan: WalkPlan, step: Step, target: StepId, rand: () => number): Branch {
  const branches = branchesOf(step).filter((b) => b.kind !== 'borderline');
  const good = branches.filter((b) => plan.reaches.get(b.to)?.has(target));
  return pick(rand, good.length ? good : branches.length ? branches : branchesOf(step));
}

/** What the technician enters to take `branch`: a reading drawn in its band, or the answer. */
function answerFor(step: Step, branch: Branch, rand: () => number, bias: number): StepAnswer {
  const acknowledged = step.safety.some((n) => n.signal === 'DANGER');
  if (step.kind === 'observation') return { stepId: step.id, answerId: branch.handle.slice('answer:'.length), acknowledged };
  if (step.kind !== 'reading') return { stepId: step.id, acknowledged };
  const band = step.bands.find((b) => `band:${b.id}` === branch.handle) ?? step.bands[0]!;
  const value = valueInBand(band, step.limits ? resolveLimits(step.limits) : {}, rand) * bias;
  return { stepId: step.id, entered: formatReading({ value, quantity: step.quantity }), acknowledged };
}

interface Decider { walk: ProcedureWalk | undefined; keep: PathRow[] }

/**
 * Decides the answer exactly as the step endpoint does (decideStep over the path so far). A drawn
 * reading the walker cannot place (a gap the bias pushed it into) is drawn again unbiased, then
 * at the middle of the band.
 */
function decide(plan: WalkPlan, d: Decider, step: Step, branch: Branch, rand: () => number, bias: number): { decided: DecidedStep; walk: ProcedureWalk; answer: StepAnswer } {
  for (const b of [bias, 1, 0]) {
    const answer = b === 0 && step.kind === 'reading' ? answerFor(step, branch, () => 0.5, 1) : answerFor(step, branch, rand, b || 1);
    try {
      return { ...decideStep(plan.doc, plan.byId, d.keep, answer, d.walk), answer };
    } catch (e) {
      if (!(e instanceof AppError) || step.kind !== 'reading') throw e;
    }
  }
  throw new Error(`The demo history cannot answer ${step.id}: no drawn reading lands in a band.`);
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

/**
 * Walks the procedure from its start towards a drawn fault, every answer decided by the same code
 * as a live step (so verdicts, re-measures, the borderline branch and Formulas are what Bench
 * stores); at most 200 answered steps.
 */
export function walkTowardsFault(plan: WalkPlan, o: WalkOptions): Walk {
  let target = drawEnding(plan, o.rand);
  const steps: WalkedStep[] = [];
  const d: Decider = { walk: undefined, keep: [] };
  let takeBack = o.rand() < o.takeBackChance;
  for (let guard = 0; guard < 200; guard++) {
    const at = d.walk ? (d.walk.path[d.keep.length]?.stepId ?? d.walk.current?.id) : plan.doc.start;
    const step = at === undefined ? undefined : plan.byId.get(at);
    if (!step) break;
    const reach = plan.reaches.get(step.id);
    if (reach && !reach.has(target) && reach.size) target = drawEnding(plan, o.rand, reach);
    const branch = aim(plan, step, target, o.rand);
    const alternatives = branchesOf(step).filter((b) => b.kind !== 'borderline' && b.to !== branch.to);
    if (takeBack && alternatives.length && (step.kind === 'observation' || step.kind === 'reading') && o.rand() < 0.4) {
      takeBack = false;
      // A first answer changed at once: stored, then superseded by the answer after the same path.
      const wrong = decide(plan, d, step, pick(o.rand, alternatives), o.rand, o.bias);
      steps.push({ stepId: step.id, kind: step.kind, decided: wrong.decided, answer: wrong.answer, superseded: true, seconds: stepSeconds(plan, step, o.rand, o.speed) });
    }
    const taken = decide(plan, d, step, branch, o.rand, o.bias);
    const walked: WalkedStep = { stepId: step.id, kind: step.kind, decided: taken.decided, answer: taken.answer, superseded: false, seconds: stepSeconds(plan, step, o.rand, o.speed) };
    if (isEnding(step)) return { steps, end: walked, endingStepId: step.id, ending: step.kind === 'finding' ? 'finding' : 'handoff' };
    steps.push(walked);
    d.keep = [...d.keep, pathRow(d.keep.length + 1, taken.answer, taken.decided)];
    d.walk = taken.walk;
  }
  return { steps, end: null, endingStepId: steps[steps.length - 1]?.stepId ?? plan.doc.start, ending: 'handoff' };
}

/** The stored path row the next decision follows, as the step endpoint keeps it. */
function pathRow(seq: number, a: StepAnswer, decided: DecidedStep): PathRow {
  return {
    id: String(seq), seq, stepId: a.stepId, next: decided.next, entered: decided.entered,
    lead: a.leadEntered ?? null, answerId: decided.answerId, acknowledged: a.acknowledged ?? false,
  };
}
