import type { ProcedureDocument, Step, StepId } from '../schema/procedure';
import { STEP_TRAITS, branchesOf, retarget } from './kinds';

/**
 * Check-order advisor. A chain is a run of independent checks (Reading or Observation steps)
 * where each check either reveals the fault (its branch leads straight to a Finding) or passes
 * to the next check. For independent checks under a single fault, testing in decreasing order
 * of p/c — the probability that the check reveals the fault over its cost in time — minimises
 * the expected time (Kadane & Simon, Annals of Statistics 5(2), 1977; Heckerman, Breese &
 * Rommelse, "Decision-theoretic troubleshooting", CACM 38(3), 1995).
 */

export interface CheckChain {
  /** The checks in the procedure's current order. */
  readonly checks: readonly StepId[];
  /** Where the last check passes to (the rest of the procedure). */
  readonly tail: StepId;
}

const isCheck = (s: Step) => STEP_TRAITS[s.kind].check;

/** The single pass target of a check whose other branches all end at Findings, else null. */
function passTarget(step: Step, byId: ReadonlyMap<StepId, Step>): StepId | null {
  if (!isCheck(step)) return null;
  const targets = new Set(branchesOf(step).map((b) => b.to));
  const pass = [...targets].filter((t) => byId.get(t)?.kind !== 'finding');
  const faults = [...targets].filter((t) => byId.get(t)?.kind === 'finding');
  return pass.length === 1 && faults.length >= 1 ? pass[0]! : null;
}

/** How many branches arrive at each step (the start counts as one arrival). */
function arrivals(doc: ProcedureDocument): Map<StepId, number> {
  const count = new Map<StepId, number>([[doc.start, 1]]);
  for (const s of doc.steps) {
    for (const to of new Set(branchesOf(s).map((b) => b.to))) count.set(to, (count.get(to) ?? 0) + 1);
  }
  return count;
}

/**
 * The chains of two or more checks in a procedure. Inside a chain every check after the first is
 * reached only from the check before it, so reordering cannot change any other path.
 * Example: a → b → c with each also branching to a Finding gives `[{ checks: ['a','b','c'], tail }]`.
 */
export function findCheckChains(doc: ProcedureDocument): CheckChain[] {
  const byId = new Map(doc.steps.map((s) => [s.id, s] as const));
  const into = arrivals(doc);
  const pass = new Map<StepId, StepId>();
  for (const s of doc.steps) {
    const t = passTarget(s, byId);
    if (t !== null) pass.set(s.id, t);
  }
  const linksOn = (from: StepId) => {
    const to = pass.get(from);
    return to !== undefined && pass.has(to) && into.get(to) === 1 && to !== doc.start ? to : null;
  };
  const hasChainPredecessor = new Set([...pass.keys()].map(linksOn).filter((t): t is StepId => t !== null));
  const chains: CheckChain[] = [];
  for (const first of pass.keys()) {
    if (hasChainPredecessor.has(first)) continue;
    const checks = [first];
    for (let next = linksOn(first); next !== null && !checks.includes(next); next = linksOn(next)) checks.push(next);
    const tail = pass.get(checks[checks.length - 1]!)!;
    if (checks.length >= 2 && !checks.includes(tail)) chains.push({ checks, tail });
  }
  return chains;
}

export interface CheckEstimate {
  readonly stepId: StepId;
  /** Share of diagnoses entering the chain whose fault this check revealed (0..1). */
  readonly revealShare: number;
  /** Time the check takes, in seconds (median of recorded times). */
  readonly seconds: number;
}

/**
 * Expected time through a chain in a given order: each check costs its time whenever the
 * diagnosis reaches it, i.e. when no earlier check revealed the fault.
 * Example: checks (p 0.5, 60 s) then (p 0.2, 30 s) → 60 + 0.5·30 = 75 s.
 */
export function expectedChainSeconds(order: readonly CheckEstimate[]): number {
  let reach = 1;
  let total = 0;
  for (const c of order) {
    total += reach * c.seconds;
    reach = Math.max(0, reach - c.revealShare);
  }
  return total;
}

/**
 * Orders checks by decreasing revealShare/seconds (ties keep the current order; a free check
 * with any chance of revealing the fault comes first).
 * Example: [(0.1, 60 s), (0.3, 60 s)] → the second check first.
 */
export function orderByRatio(checks: readonly CheckEstimate[]): CheckEstimate[] {
  const ratio = (c: CheckEstimate) => (c.seconds > 0 ? c.revealShare / c.seconds : c.revealShare > 0 ? Infinity : 0);
  return checks.map((c, i) => ({ c, i })).sort((a, b) => ratio(b.c) - ratio(a.c) || a.i - b.i).map(({ c }) => c);
}

export interface ChainAdvice {
  readonly chain: CheckChain;
  readonly current: readonly CheckEstimate[];
  readonly proposed: readonly CheckEstimate[];
  readonly currentSeconds: number;
  readonly proposedSeconds: number;
  /** True when the proposed order differs from the current one. */
  readonly changes: boolean;
}

/** Advice for one chain from per-check estimates (in the chain's current order). */
export function adviseChain(chain: CheckChain, estimates: readonly CheckEstimate[]): ChainAdvice {
  const proposed = orderByRatio(estimates);
  return {
    chain,
    current: estimates,
    proposed,
    currentSeconds: expectedChainSeconds(estimates),
    proposedSeconds: expectedChainSeconds(proposed),
    changes: proposed.some((c, i) => c.stepId !== estimates[i]!.stepId),
  };
}

/**
 * A copy of the document with the chain's checks in `order`: arrivals at the old first check go
 * to the new first, each check passes to the next in the new order, the last passes to the tail;
 * every branch to a Finding stays as it was.
 * Example: chain a → b → tail reordered to [b, a] gives start → b → a → tail.
 */
export function reorderChain(doc: ProcedureDocument, chain: CheckChain, order: readonly StepId[]): ProcedureDocument {
  const same = [...order].sort().join() === [...chain.checks].sort().join();
  if (!same || order.length !== chain.checks.length) throw new Error('The new order must hold exactly the checks of the chain.');
  const inChain = new Set(chain.checks);
  const oldFirst = chain.checks[0]!;
  const newFirst = order[0]!;
  const steps = doc.steps.map((s) => {
    if (!inChain.has(s.id)) return retarget(s, oldFirst, newFirst);
    const i = order.indexOf(s.id);
    const oldPass = chain.checks[chain.checks.indexOf(s.id) + 1] ?? chain.tail;
    return retarget(s, oldPass, order[i + 1] ?? chain.tail);
  });
  return { ...doc, start: doc.start === oldFirst ? newFirst : doc.start, steps };
}
