import type { Answer, Limits, Part, ProcedureDocument, SafetyNote, Step, StepKind } from '../schema/procedure';
import { formatLimit } from '../measure/format';
import type { Quantity } from '../measure/quantities';
import { resolveLimits } from '../measure/verdict';

/** Limits as the technician sees them, in the step's display unit. */
export interface LimitsView {
  readonly min?: string;
  readonly max?: string;
  /** "0.2 – 1 Ω", "at least 150 V", "5 kΩ ± 20 % (4 – 6 kΩ)". */
  readonly text: string;
}

/** Everything the Bench shows for one step. */
export interface StepView {
  readonly id: string;
  readonly kind: StepKind;
  readonly title: string;
  readonly instructions: string;
  /** Most severe first. */
  readonly safety: readonly SafetyNote[];
  /** A DANGER note must be acknowledged before the step can be answered. */
  readonly mustAcknowledge: boolean;
  readonly limitsNote: string;
  readonly question?: string;
  readonly answers?: readonly Pick<Answer, 'id' | 'label'>[];
  readonly confirmLabel?: string;
  readonly quantity?: Quantity;
  readonly unit?: string;
  readonly limits?: LimitsView;
  readonly leadNull?: boolean;
  /** The temperature step whose value corrects this copper-winding reading. */
  readonly temperatureStep?: string;
  readonly cause?: string;
  readonly repair?: string;
  readonly parts?: readonly Part[];
  readonly reason?: string;
}

const ORDER = { DANGER: 0, WARNING: 1, CAUTION: 2, NOTICE: 3 } as const;

/** Limits in display units. Example: range 0.2–1 Ω → `{ min: '0.2 Ω', max: '1 Ω', text: '0.2 – 1 Ω' }`. */
export function limitsView(limits: Limits, quantity: Quantity, unit: string): LimitsView {
  const { min, max } = resolveLimits(limits);
  const f = (v: number) => formatLimit(v, quantity, unit);
  const bare = (v: number) => f(v).replace(` ${unit}`, '');
  const ends = { ...(min === undefined ? {} : { min: f(min) }), ...(max === undefined ? {} : { max: f(max) }) };
  let text: string;
  if (min !== undefined && max !== undefined) text = `${bare(min)} – ${f(max)}`;
  else if (min !== undefined) text = `at least ${f(min)}`;
  else text = `at most ${f(max!)}`;
  if (limits.kind === 'nominal') text = `${f(limits.nominal)} ± ${limits.tolerancePercent} % (${text})`;
  return { ...ends, text };
}

/**
 * What the technician must see at a step. Example: `stepView(doc, doc.steps[0]).safety[0].signal` is 'DANGER'
 * for a step with a DANGER note.
 */
export function stepView(doc: ProcedureDocument, step: Step): StepView {
  const safety = [...step.safety].sort((a, b) => ORDER[a.signal] - ORDER[b.signal]);
  const base = {
    id: step.id, kind: step.kind, title: step.title, instructions: step.instructions, safety,
    mustAcknowledge: safety.some((n) => n.signal === 'DANGER'), limitsNote: doc.meta.limitsNote,
  };
  switch (step.kind) {
    case 'reading':
      return {
        ...base, quantity: step.quantity, unit: step.unit, leadNull: step.leadNull,
        ...(step.limits ? { limits: limitsView(step.limits, step.quantity, step.unit) } : {}),
        ...(step.winding ? { temperatureStep: step.winding.temperatureStep } : {}),
      };
    case 'formula':
      return { ...base, quantity: step.quantity, unit: step.unit, ...(step.limits ? { limits: limitsView(step.limits, step.quantity, step.unit) } : {}) };
    case 'observation':
      return { ...base, question: step.question, answers: step.answers.map(({ id, label }) => ({ id, label })) };
    case 'task':
      return { ...base, confirmLabel: step.confirmLabel };
    case 'finding':
      return { ...base, cause: step.cause, repair: step.repair, parts: step.parts };
    case 'handoff':
      return { ...base, reason: step.reason };
  }
}
