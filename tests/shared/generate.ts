import { CURRENT_SCHEMA_VERSION, procedureDocumentSchema, type ProcedureDocument, type StepInput } from '@shared/schema';

import { rng } from '@shared/stats/rng';

export { rng };

const id = (i: number) => `s${i}`;
const pos = (i: number) => ({ x: (i % 10) * 220, y: Math.floor(i / 10) * 140 });

/** A Reading that splits the line into one band per target, with limits around the middle band. */
function reading(i: number, targets: number[]): StepInput {
  const cuts = targets.slice(1).map((_, k) => (k + 1) * 10);
  const bands = targets.map((t, k) => ({
    id: `b${k}`, label: `Band ${k}`, next: id(t),
    ...(k > 0 ? { lower: { value: cuts[k - 1]!, inclusive: true } } : {}),
    ...(k < cuts.length ? { upper: { value: cuts[k]!, inclusive: false } } : {}),
  }));
  return {
    id: id(i), kind: 'reading', title: `Reading ${i}`, quantity: 'resistance', unit: 'Ω', position: pos(i),
    limits: { kind: 'range', min: 0, max: 10 * Math.max(1, targets.length) }, bands,
  };
}

function stepFor(i: number, targets: number[], random: () => number): StepInput {
  if (targets.length === 0) return { id: id(i), kind: 'finding', title: `Finding ${i}`, cause: 'Generated cause', repair: 'Generated repair', position: pos(i) };
  if (i === 0 || (targets.length > 1 && random() < 0.4)) return reading(i, targets);
  if (targets.length === 1) {
    return random() < 0.15
      ? { id: id(i), kind: 'formula', title: `Formula ${i}`, expression: 'parallel(s0, s0)', quantity: 'resistance', unit: 'Ω', next: id(targets[0]!), position: pos(i) }
      : { id: id(i), kind: 'task', title: `Task ${i}`, next: id(targets[0]!), position: pos(i) };
  }
  return {
    id: id(i), kind: 'observation', title: `Look ${i}`, question: 'Which?', position: pos(i),
    answers: targets.map((t, k) => ({ id: `a${k}`, label: `Answer ${k}`, next: id(t) })),
  };
}

/**
 * A sound procedure of n steps: every step hangs below an earlier one, every non-ending step
 * has a branch further down (so an ending is always reachable), some branches loop back, the
 * tail steps are Findings, and Formulas read the first Reading (which dominates every step).
 */
export function soundProcedure(n: number, seed = 1): ProcedureDocument {
  const random = rng(seed);
  const firstEnding = Math.max(1, n - Math.max(1, Math.floor(n / 20)));
  const out: number[][] = Array.from({ length: n }, () => []);
  for (let i = 1; i < n; i++) {
    let p = Math.max(0, Math.min(firstEnding - 1, i - 1 - Math.floor(random() * 10)));
    for (let tries = 0; out[p]!.length >= 6 && tries < 10; tries++) p = Math.max(0, Math.min(firstEnding - 1, i - 1 - Math.floor(random() * 30)));
    // Still full: take the nearest earlier step with room (step 0 may have to take many).
    for (let q = Math.min(firstEnding - 1, i - 1); out[p]!.length >= 6 && q >= 0; q--) if (out[q]!.length < 6) p = q;
    out[p]!.push(i);
  }
  for (let v = 0; v < firstEnding; v++) {
    const list = out[v]!;
    if (list.length === 0 || random() < 0.3) list.push(v + 1 + Math.floor(random() * Math.min(20, n - v - 1)));
    if (list.length < 8 && v > 0 && random() < 0.05) list.push(Math.max(0, v - 1 - Math.floor(random() * 20)));
  }
  const steps = out.map((targets, i) => stepFor(i, i >= firstEnding ? [] : targets, random));
  return procedureDocumentSchema.parse({ schemaVersion: CURRENT_SCHEMA_VERSION, meta: { title: `Generated ${n}`, symptom: 'Generated', ignitionSystem: 'other' }, start: 's0', steps });
}

/** An arbitrary graph (possibly unsound): random branches between Tasks and Observations. */
export function randomGraph(n: number, edges: number, seed: number): ProcedureDocument {
  const random = rng(seed);
  const out: number[][] = Array.from({ length: n }, () => []);
  for (let e = 0; e < edges; e++) {
    const v = Math.floor(random() * n);
    if (out[v]!.length < 8) out[v]!.push(Math.floor(random() * n));
  }
  const steps: StepInput[] = out.map((targets, i) => {
    if (targets.length === 0) return random() < 0.5 ? { id: id(i), kind: 'finding', title: `F${i}`, cause: 'c', repair: 'r' } : { id: id(i), kind: 'task', title: `T${i}` };
    if (targets.length === 1) return { id: id(i), kind: 'task', title: `T${i}`, next: id(targets[0]!) };
    return { id: id(i), kind: 'observation', title: `O${i}`, question: 'q', answers: targets.map((t, k) => ({ id: `a${k}`, label: `A${k}`, next: id(t) })) };
  });
  return procedureDocumentSchema.parse({ schemaVersion: CURRENT_SCHEMA_VERSION, meta: { title: 'Random', symptom: 'x', ignitionSystem: 'other' }, start: 's0', steps });
}
