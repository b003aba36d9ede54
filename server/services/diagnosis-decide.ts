import type { MeterSpec, Step } from '@shared/schema/procedure';
import { parseReading } from '@shared/measure/parse';
import { decideReading, resolveLimits, type Verdict } from '@shared/measure/verdict';
import { evaluateFormula } from '@shared/measure/formula';
import { bandFor } from '@shared/measure/bands';
import { QUANTITY_INFO, type Quantity } from '@shared/measure/quantities';
import { formatReading } from '@shared/measure/format';
import { AppError, badRequest } from '../lib/errors';

/** An earlier answered step on the path (not superseded), oldest first. */
export interface PathRow { id: string; seq: number; stepId: string; value: number | null; next: string | null }

export interface StepAnswer { entered?: string | undefined; leadEntered?: string | undefined; answerId?: string | undefined; acknowledged?: boolean | undefined }

export interface DecidedStep {
  entered: string | null; value: number | null; unit: string | null; verdict: Verdict | null;
  bandId: string | null; answerId: string | null; next: string | null;
  shown: Record<string, unknown>;
}

function limitsText(step: Step & { unit: string; quantity: Quantity }, limits: ReturnType<typeof resolveLimits>): string {
  const f = (v: number) => formatReading({ value: v, quantity: step.quantity }, { unit: step.unit });
  if (limits.min !== undefined && limits.max !== undefined) return `${f(limits.min)} to ${f(limits.max)}`;
  if (limits.min !== undefined) return `at least ${f(limits.min)}`;
  if (limits.max !== undefined) return `at most ${f(limits.max)}`;
  return '';
}

/** What the screen showed for a step, rebuilt from the pinned version so the record can be trusted. */
export function shownOf(step: Step): Record<string, unknown> {
  const base = { title: step.title, instructions: step.instructions, safety: step.safety };
  switch (step.kind) {
    case 'reading':
    case 'formula': {
      const limits = step.limits ? resolveLimits(step.limits) : {};
      return { ...base, quantity: step.quantity, unit: step.unit, limits, limitsText: limitsText(step, limits) };
    }
    case 'observation': return { ...base, question: step.question, answers: step.answers.map((a) => ({ id: a.id, label: a.label })) };
    case 'task': return { ...base, confirmLabel: step.confirmLabel };
    case 'finding': return { ...base, cause: step.cause, repair: step.repair, parts: step.parts };
    case 'handoff': return { ...base, reason: step.reason };
  }
}

function parseOrRefuse(text: string | undefined, quantity: Quantity, unit: string, what: string): number {
  if (text === undefined || text.trim() === '') throw badRequest(`Type the ${what} before going on.`, [{ path: 'entered', message: 'Required' }]);
  const r = parseReading(text, quantity, unit);
  if (!r.ok) throw badRequest(`${r.error.message} ${r.error.suggestion}`, [{ path: 'entered', message: r.error.message }]);
  return r.reading.value;
}

function noBand(stepId: string): AppError {
  return new AppError(422, 'no_band', `Step "${stepId}" of this procedure version has no band for that value. Hand the machine to a senior technician and tell the author.`);
}

/** How many times in a row the path already re-measured this step (the borderline rule counts them). */
function remeasuredCount(path: readonly PathRow[], stepId: string): number {
  let n = 0;
  for (let i = path.length - 1; i >= 0 && path[i]!.stepId === stepId && path[i]!.next === stepId; i--) n++;
  return n;
}

function decideReadingStep(step: Extract<Step, { kind: 'reading' }>, answer: StepAnswer, ctx: DecideContext): DecidedStep {
  const value = parseOrRefuse(answer.entered, step.quantity, step.unit, QUANTITY_INFO[step.quantity].label);
  const lead = step.leadNull && answer.leadEntered ? parseOrRefuse(answer.leadEntered, 'resistance', 'Ω', 'test-lead reading') : undefined;
  const temperature = step.winding ? ctx.valueOf(step.winding.temperatureStep) : undefined;
  if (step.winding && temperature === undefined) {
    throw new AppError(422, 'missing_value', `${step.title} needs the engine temperature, which was not measured on this path. Go back and measure it.`);
  }
  const meter = step.meter ?? ctx.meterFor(step.quantity);
  const d = decideReading({
    value, limits: step.limits, meter, rule: step.decision, leadResistance: lead,
    winding: step.winding && temperature !== undefined ? { temperature, referenceTemperature: step.winding.referenceTemperature } : undefined,
    bands: step.bands, borderline: step.borderline, remeasured: remeasuredCount(ctx.path, step.id),
  });
  const r = d.route;
  if (r.kind === 'no-band') throw noBand(step.id);
  const next = r.kind === 're-measure' ? step.id : r.next;
  return {
    entered: answer.leadEntered ? `${answer.entered} (leads ${answer.leadEntered})` : answer.entered!,
    value: d.value, unit: QUANTITY_INFO[step.quantity].base, verdict: d.verdict,
    bandId: r.kind === 'band' ? r.band.id : null, answerId: null, next,
    shown: { ...shownOf(step), interval: d.interval, corrections: d.corrections, route: r.kind },
  };
}

function decideFormulaStep(step: Extract<Step, { kind: 'formula' }>, ctx: DecideContext): DecidedStep {
  const r = evaluateFormula(step.expression, ctx.formulaValues(), { expect: step.quantity });
  if (!r.ok) throw new AppError(422, 'formula_failed', `The formula of step "${step.id}" cannot be computed here: ${r.error.message}`);
  const band = step.bands.length ? bandFor(step.bands, r.value) : undefined;
  const next = band?.next ?? step.next ?? null;
  if (!next) throw noBand(step.id);
  const verdict = step.limits ? decideReading({ value: r.value, limits: step.limits }).verdict : null;
  return { entered: null, value: r.value, unit: QUANTITY_INFO[step.quantity].base, verdict, bandId: band?.id ?? null, answerId: null, next, shown: shownOf(step) };
}

export interface DecideContext {
  path: readonly PathRow[];
  valueOf(stepId: string): number | undefined;
  formulaValues(): Record<string, { value: number; quantity: Quantity }>;
  meterFor(quantity: Quantity): MeterSpec | undefined;
}

/**
 * Re-decides one answered step against the pinned version with the shared measure engine:
 * parses the typed reading, applies lead null and temperature correction, gives the verdict and
 * the branch. Throws a 400/422 AppError the technician can act on.
 */
export function decideStep(step: Step, answer: StepAnswer, ctx: DecideContext): DecidedStep {
  const none = { entered: null, value: null, unit: null, verdict: null, bandId: null, answerId: null };
  if (step.safety.some((n) => n.signal === 'DANGER') && !answer.acknowledged && step.kind !== 'formula') {
    throw new AppError(422, 'not_acknowledged', `Read and acknowledge the DANGER note of "${step.title}" before answering it.`);
  }
  switch (step.kind) {
    case 'reading': return decideReadingStep(step, answer, ctx);
    case 'formula': return decideFormulaStep(step, ctx);
    case 'observation': {
      const a = step.answers.find((x) => x.id === answer.answerId);
      if (!a) throw badRequest(`Pick one of the answers of "${step.title}".`, [{ path: 'answerId', message: 'Not an answer of this step' }]);
      return { ...none, answerId: a.id, next: a.next, shown: shownOf(step) };
    }
    case 'task':
      if (!step.next) throw noBand(step.id);
      return { ...none, next: step.next, shown: shownOf(step) };
    case 'finding':
    case 'handoff':
      return { ...none, next: null, shown: shownOf(step) };
  }
}

/** The decide context over the path rows of a diagnosis and the meter it uses. */
export function decideContext(path: readonly PathRow[], steps: ReadonlyMap<string, Step>, meterEntries: readonly ({ quantity: string } & MeterSpec)[]): DecideContext {
  return {
    path,
    valueOf(stepId) {
      for (let i = path.length - 1; i >= 0; i--) if (path[i]!.stepId === stepId && path[i]!.value !== null) return path[i]!.value!;
      return undefined;
    },
    formulaValues() {
      const out: Record<string, { value: number; quantity: Quantity }> = {};
      for (const row of path) {
        const s = steps.get(row.stepId);
        if (row.value !== null && s && (s.kind === 'reading' || s.kind === 'formula')) out[row.stepId] = { value: row.value, quantity: s.quantity };
      }
      return out;
    },
    meterFor(quantity) {
      const e = meterEntries.find((m) => m.quantity === quantity);
      return e ? { percentOfReading: e.percentOfReading, counts: e.counts, resolution: e.resolution } : undefined;
    },
  };
}
