import type { ReadingStep } from '../schema/procedure';
import type { FormulaValue } from '../measure/formula';
import { parseReading, type Reading, type ReadingError } from '../measure/parse';
import { decideReading, type ReadingDecision } from '../measure/verdict';

/** What the technician typed at a Reading: the value, and the test-lead reading to null out. */
export interface EnteredReading {
  readonly text: string;
  readonly leadText?: string | undefined;
}

export type EnteredDecision =
  | { readonly ok: true; readonly reading: Reading; readonly decision: ReadingDecision }
  | {
    readonly ok: false;
    readonly code: 'bad-reading' | 'missing-value';
    readonly message: string;
    readonly readingError?: ReadingError;
    /** The reading itself, when it was understood (the test leads or the temperature failed). */
    readonly reading?: Reading;
  };

/**
 * Parses what was typed at a Reading and decides it: lead null, copper-winding correction from
 * the temperature measured earlier on the path, the meter's uncertainty, the borderline rule
 * (after `remeasured` borderline readings at this step) and the band. The phone's live verdict,
 * the walker and so the server's record all come from here, so they cannot disagree.
 * Example: decideEntered(coilStep, { text: '0,4' }, {}, 0) → { ok: true, decision: { verdict: 'within', … } }
 */
export function decideEntered(
  step: ReadingStep, entered: EnteredReading, values: Readonly<Record<string, FormulaValue>>, remeasured: number,
): EnteredDecision {
  const parsed = parseReading(entered.text, step.quantity, step.unit);
  if (!parsed.ok) return { ok: false, code: 'bad-reading', message: parsed.error.message, readingError: parsed.error };
  const reading = parsed.reading;
  let lead: number | undefined;
  if (step.leadNull && entered.leadText !== undefined && entered.leadText.trim() !== '') {
    const l = parseReading(entered.leadText, 'resistance', 'Ω');
    if (!l.ok) return { ok: false, code: 'bad-reading', message: `Test leads: ${l.error.message}`, readingError: l.error, reading };
    lead = l.reading.value;
  }
  const temp = step.winding ? values[step.winding.temperatureStep] : undefined;
  if (step.winding && !temp) {
    return { ok: false, code: 'missing-value', message: `${step.title} needs the engine temperature, which was not measured on this path.`, reading };
  }
  const decision = decideReading({
    value: reading.value, limits: step.limits, meter: step.meter, rule: step.decision, leadResistance: lead,
    winding: step.winding && temp ? { temperature: temp.value, referenceTemperature: step.winding.referenceTemperature } : undefined,
    bands: step.bands, borderline: step.borderline, remeasured,
  });
  return { ok: true, reading, decision };
}
