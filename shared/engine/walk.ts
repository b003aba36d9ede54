import type { FormulaStep, ProcedureDocument, ReadingStep, Step } from '../schema/procedure';
import { bandFor } from '../measure/bands';
import { evaluateFormula, type FormulaValue } from '../measure/formula';
import type { Reading, ReadingError } from '../measure/parse';
import { decideReading, type ReadingDecision } from '../measure/verdict';
import { decideEntered } from './reading-entry';
import { unknownKind } from './kinds';
import { stepView, type StepView } from './step-view';

/** What the technician did at a step. */
export type WalkAnswer =
  | { readonly kind: 'reading'; readonly text: string; /** Test-lead reading to null out, if the step offers it. */ readonly leadText?: string }
  | { readonly kind: 'observation'; readonly answerId: string }
  | { readonly kind: 'task' };

/** One entry of the diagnosis log, in the order it happened. An entry for an earlier step goes back. */
export interface WalkEntry {
  readonly stepId: string;
  readonly answer: WalkAnswer;
  /** The DANGER note was acknowledged. */
  readonly acknowledged?: boolean;
  /** Which visit to go back to when a loop passed the step more than once (index into `path`). */
  readonly pathIndex?: number;
}

export type WalkProblemCode =
  | 'no-start' | 'wrong-step' | 'wrong-kind' | 'not-acknowledged' | 'bad-reading' | 'unknown-answer'
  | 'missing-value' | 'no-band' | 'formula-failed' | 'dangling' | 'ended';

export interface WalkProblem {
  readonly code: WalkProblemCode;
  readonly message: string;
  readonly readingError?: ReadingError;
}

export interface PathStep {
  readonly stepId: string;
  readonly kind: Step['kind'];
  /** Index of the log entry that answered it; null for computed Formulas and the ending. */
  readonly entryIndex: number | null;
  readonly answer?: WalkAnswer;
  readonly reading?: Reading;
  readonly decision?: ReadingDecision;
  /** Value in base units after corrections (Readings) or as computed (Formulas). */
  readonly value?: number;
  /** Where the diagnosis went next; the same step when a borderline reading is re-measured. */
  readonly next: string | null;
  readonly outcome: 'answered' | 're-measure' | 'computed' | 'ended' | 'stuck';
}

export interface EntryRecord {
  readonly index: number;
  readonly entry: WalkEntry;
  /** Superseded entries stay in the record: the path they were on no longer applies. */
  readonly status: 'applied' | 'superseded' | 'rejected';
  readonly problem?: WalkProblem;
}

export interface WalkState {
  readonly status: 'in-progress' | 'ended' | 'stuck';
  /** The step to answer now; null when ended or stuck. */
  readonly current: StepView | null;
  /** The current step asks to measure again (the last reading was borderline). */
  readonly remeasure: boolean;
  readonly path: readonly PathStep[];
  readonly record: readonly EntryRecord[];
  readonly ending: StepView | null;
  /** Values measured or computed on the current path, by step id. */
  readonly values: Readonly<Record<string, FormulaValue>>;
  /** Why the walk is stuck, or why the last entry was refused. */
  readonly problem: WalkProblem | null;
}

type Outcome = { path: PathStep; value?: FormulaValue } | WalkProblem;

/**
 * How many borderline readings in a row were re-measured at `stepId` at the end of the path: the
 * borderline rule's count, on the phone's live verdict and in the walker alike.
 * Example: after two re-measured readings at 'capOhms', remeasuredAt(path, 'capOhms') === 2.
 */
export function remeasuredAt(path: readonly Pick<PathStep, 'stepId' | 'outcome'>[], stepId: string): number {
  let n = 0;
  for (let i = path.length - 1; i >= 0 && path[i]!.stepId === stepId && path[i]!.outcome === 're-measure'; i--) n++;
  return n;
}

const problem = (code: WalkProblemCode, message: string, extra: Partial<WalkProblem> = {}): WalkProblem => ({ code, message, ...extra });

/**
 * A walk over a procedure that takes one entry at a time. `walkProcedure` replays a whole log with
 * it; the server keeps one per diagnosis being stepped, so an answer costs one entry rather than a
 * replay of the path. Treat its fields as read-only; `fork` before applying to a walk kept elsewhere.
 */
export class ProcedureWalk {
  readonly steps: ReadonlyMap<string, Step>;
  path: PathStep[] = [];
  record: EntryRecord[] = [];
  values: Record<string, FormulaValue> = {};
  current: Step | null = null;
  status: WalkState['status'] = 'in-progress';
  problem: WalkProblem | null = null;

  private constructor(readonly doc: ProcedureDocument, steps?: ReadonlyMap<string, Step>) {
    if (steps) {
      this.steps = steps;
      return;
    }
    const byId = new Map<string, Step>();
    for (const s of doc.steps) if (!byId.has(s.id)) byId.set(s.id, s);
    this.steps = byId;
  }

  /** A walk standing at the procedure's first step (or stuck, when that step does not exist). */
  static start(doc: ProcedureDocument): ProcedureWalk {
    const walk = new ProcedureWalk(doc);
    if (!walk.steps.has(doc.start)) walk.stick(problem('no-start', `The procedure's first step "${doc.start}" does not exist; it cannot be walked.`));
    else walk.arrive(doc.start);
    return walk;
  }

  /** An independent copy: applying entries to it leaves this walk as it is. */
  fork(): ProcedureWalk {
    const copy = new ProcedureWalk(this.doc, this.steps);
    Object.assign(copy, { path: [...this.path], record: [...this.record], values: { ...this.values }, current: this.current, status: this.status, problem: this.problem });
    return copy;
  }

  /** Takes the next log entry; its record says whether it was applied or refused, and why. */
  take(entry: WalkEntry): EntryRecord {
    this.apply(entry, this.record.length);
    return this.record[this.record.length - 1]!;
  }

  private arrive(id: string | null): void {
    const step = id === null ? undefined : this.steps.get(id);
    if (!step) return this.stick(problem('dangling', `The procedure points to "${id}", which does not exist; hand the machine to a senior technician.`));
    this.current = step;
    switch (step.kind) {
      case 'finding':
      case 'handoff':
        this.path.push({ stepId: step.id, kind: step.kind, entryIndex: null, next: null, outcome: 'ended' });
        this.status = 'ended';
        this.current = null;
        return;
      case 'formula': {
        const r = this.compute(step);
        if ('code' in r) return this.stick(r);
        return this.follow(r);
      }
      case 'link':
        // Joined with its other procedure, a link passes on to that procedure's first step.
        if (step.next === undefined) return this.stick(problem('dangling', `${step.title} continues in the procedure "${step.procedure}", which this walk does not have; reload with signal, or hand the machine to a senior technician.`));
        return this.follow({ path: { stepId: step.id, kind: 'link', entryIndex: null, next: step.next, outcome: 'computed' } });
      case 'reading':
      case 'observation':
      case 'task':
        return; // the technician answers it
      default:
        return unknownKind(step);
    }
  }

  private stick(p: WalkProblem): void {
    this.status = 'stuck';
    this.problem = p;
    this.current = null;
  }

  private follow(r: { path: PathStep; value?: FormulaValue }): void {
    this.path.push(r.path);
    if (r.value) this.values[r.path.stepId] = r.value;
    if (r.path.outcome === 're-measure' || r.path.outcome === 'stuck') return;
    this.arrive(r.path.next);
  }

  private compute(step: FormulaStep): Outcome {
    const r = evaluateFormula(step.expression, this.values, { expect: step.quantity });
    if (!r.ok) return problem('formula-failed', `The app could not compute ${step.title}: ${r.error.message}`);
    const decision = decideReading({ value: r.value, limits: step.limits, bands: step.bands });
    const next = step.bands.length > 0 ? (bandFor(step.bands, r.value)?.next ?? null) : (step.next ?? null);
    if (next === null) return problem('no-band', `No band of ${step.title} covers the computed value; hand the machine to a senior technician.`);
    const value = { value: r.value, quantity: step.quantity };
    return { path: { stepId: step.id, kind: 'formula', entryIndex: null, decision, value: r.value, next, outcome: 'computed' }, value };
  }

  private measure(step: ReadingStep, answer: Extract<WalkAnswer, { kind: 'reading' }>, index: number): Outcome {
    const r = decideEntered(step, answer, this.values, remeasuredAt(this.path, step.id));
    if (!r.ok) return problem(r.code, r.message, r.readingError ? { readingError: r.readingError } : {});
    const { decision } = r;
    const route = decision.route;
    const base = { stepId: step.id, kind: 'reading' as const, entryIndex: index, answer, reading: r.reading, decision, value: decision.value };
    const value = { value: decision.value, quantity: step.quantity };
    if (route.kind === 're-measure') return { path: { ...base, next: step.id, outcome: 're-measure' }, value };
    if (route.kind === 'no-band') return { path: { ...base, next: null, outcome: 'stuck' }, value };
    return { path: { ...base, next: route.next, outcome: 'answered' }, value };
  }

  private answer(step: Step, entry: WalkEntry, index: number): Outcome {
    const a = entry.answer;
    if (step.kind !== a.kind) return problem('wrong-kind', `${step.title} expects ${step.kind === 'observation' ? 'an answer' : `a ${step.kind}`}, not a ${a.kind}.`);
    if (step.safety.some((n) => n.signal === 'DANGER') && !entry.acknowledged) {
      return problem('not-acknowledged', 'Read and acknowledge the DANGER note before answering this step.');
    }
    const done = (next: string | null): Outcome => ({ path: { stepId: step.id, kind: step.kind, entryIndex: index, answer: a, next, outcome: 'answered' } });
    switch (step.kind) {
      case 'reading':
        return a.kind === 'reading' ? this.measure(step, a, index) : problem('wrong-kind', `${step.title} expects a reading.`);
      case 'observation': {
        const chosen = a.kind === 'observation' ? step.answers.find((x) => x.id === a.answerId) : undefined;
        return chosen ? done(chosen.next) : problem('unknown-answer', `"${a.kind === 'observation' ? a.answerId : a.kind}" is not one of the answers of ${step.title}.`);
      }
      case 'task':
        return step.next === undefined ? problem('dangling', `${step.title} has no next step; hand the machine to a senior technician.`) : done(step.next);
      default:
        return unknownKind(step); // kinds the technician does not answer fail `step.kind !== a.kind` above
    }
  }

  /** Going back: later path steps no longer apply; their entries stay in the record as superseded. */
  private rewind(to: number): void {
    const target = this.path[to]!.stepId;
    const dropped = new Set(this.path.slice(to).map((p) => p.entryIndex).filter((i): i is number => i !== null));
    this.record = this.record.map((r) => (dropped.has(r.index) ? { ...r, status: 'superseded' } : r));
    this.path = this.path.slice(0, to);
    this.values = {};
    for (const p of this.path) {
      const s = this.steps.get(p.stepId);
      if (p.value !== undefined && s && (s.kind === 'reading' || s.kind === 'formula')) this.values[p.stepId] = { value: p.value, quantity: s.quantity };
    }
    this.current = this.steps.get(target) ?? null;
    this.status = 'in-progress';
    this.problem = null;
  }

  private backTarget(entry: WalkEntry): number {
    if (entry.pathIndex !== undefined) {
      const p = this.path[entry.pathIndex];
      return p && p.stepId === entry.stepId && p.entryIndex !== null ? entry.pathIndex : -1;
    }
    for (let i = this.path.length - 1; i >= 0; i--) {
      const p = this.path[i]!;
      if (p.stepId !== entry.stepId || p.entryIndex === null) continue;
      // A run of re-measurements is one visit: changing it starts that visit afresh.
      while (i > 0 && this.path[i - 1]!.stepId === entry.stepId && this.path[i - 1]!.outcome === 're-measure') i--;
      return i;
    }
    return -1;
  }

  private apply(entry: WalkEntry, index: number): void {
    const isCurrent = this.current?.id === entry.stepId && entry.pathIndex === undefined;
    if (!isCurrent) {
      const k = this.backTarget(entry);
      if (k < 0) {
        const p = this.status === 'ended'
          ? problem('ended', 'The diagnosis has ended; go back to a step on its path to change an answer.')
          : problem('wrong-step', `"${entry.stepId}" is not the current step nor on the path taken.`);
        this.record.push({ index, entry, status: 'rejected', problem: p });
        this.problem = p;
        return;
      }
      this.rewind(k);
    }
    const outcome = this.answer(this.current!, entry, index);
    if ('code' in outcome) {
      this.record.push({ index, entry, status: 'rejected', problem: outcome });
      this.problem = outcome;
      return;
    }
    this.record.push({ index, entry, status: 'applied' });
    this.problem = null;
    this.follow(outcome);
    if (outcome.path.outcome === 'stuck') {
      this.stick(problem('no-band', `No band of ${this.steps.get(outcome.path.stepId)!.title} covers ${outcome.path.reading?.understood}; check the reading, or hand the machine to a senior technician.`));
    }
  }

  /** What to show and where the walk went, for screens. */
  state(): WalkState {
    const last = this.path[this.path.length - 1];
    const endingStep = this.status === 'ended' && last ? this.steps.get(last.stepId) : undefined;
    return {
      status: this.status,
      current: this.status === 'in-progress' && this.current ? stepView(this.doc, this.current) : null,
      remeasure: this.status === 'in-progress' && last?.outcome === 're-measure',
      path: this.path, record: this.record,
      ending: endingStep ? stepView(this.doc, endingStep) : null,
      values: this.values, problem: this.problem,
    };
  }
}

/**
 * Replays a diagnosis log over a procedure: where it stands, what to show, where it went.
 * Pure: the same document and log always give the same state.
 * Example: `walkProcedure(doc, [{ stepId: 'plugSpark', answer: { kind: 'observation', answerId: 'none' } }]).current.id`
 * → the step after the "none" answer.
 */
export function walkProcedure(doc: ProcedureDocument, log: readonly WalkEntry[]): WalkState {
  const walk = ProcedureWalk.start(doc);
  if (walk.problem?.code === 'no-start') return walk.state();
  for (const entry of log) walk.take(entry);
  return walk.state();
}
