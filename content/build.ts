import { CURRENT_SCHEMA_VERSION, procedureDocumentSchema, type ProcedureDocument, type ProcedureMeta, type SafetyNote, type StepInput } from '@shared/schema';
import type { Hazard, MeterSpec } from '@shared/schema';
import type { ReadingQuantity } from '@shared/measure';
import { layoutTopDown } from './layout';

/** Small builders so the demo procedures read like a checklist. All limit values are base units. */

export const LIMITS_NOTE =
  'Illustrative demo limits for the fictional Larkspur Lane Powersports fleet (Wren 50, Badger 110, Heron 125). ' +
  "The manufacturer's service data and local regulations come first.";

type Common = { title: string; instructions: string; safety?: SafetyNote[]; hazards?: Hazard[]; minutes?: number };

export const task = (id: string, next: string, c: Common & { confirmLabel?: string }): StepInput => ({ id, kind: 'task', next, ...c });

export const ask = (id: string, question: string, answers: [string, string, string][], c: Common): StepInput => ({
  id, kind: 'observation', question, answers: answers.map(([aid, label, next]) => ({ id: aid, label, next })), ...c,
});

export const finding = (id: string, title: string, cause: string, repair: string, parts: { name: string; partNumber?: string }[] = []): StepInput => ({
  id, kind: 'finding', title, cause, repair, parts, instructions: '',
});

export const handoff = (id: string, title: string, reason: string): StepInput => ({ id, kind: 'handoff', title, reason, instructions: '' });

type Measure = Common & {
  quantity: ReadingQuantity;
  unit: string;
  meter?: MeterSpec;
  decision?: 'simple' | 'guarded';
  leadNull?: boolean;
  winding?: { material: 'copper'; temperatureStep: string; referenceTemperature?: number };
  borderline?: { action: 'branch'; next: string; label?: string } | { action: 're-measure'; attempts?: number };
};

/** Three bands over the whole line: below min, min–max (closed), above max. */
export function bands3(min: number, max: number, to: { low: string; ok: string; high: string }) {
  return [
    { id: 'below', label: 'Below limits', upper: { value: min, inclusive: false }, next: to.low },
    { id: 'within', label: 'Within limits', lower: { value: min, inclusive: true }, upper: { value: max, inclusive: true }, next: to.ok },
    { id: 'above', label: 'Above limits', lower: { value: max, inclusive: false }, next: to.high },
  ];
}

/** A Reading with limits min–max and three bands: below, within, above. */
export function reading3(id: string, m: Measure & { min: number; max: number; low: string; ok: string; high: string }): StepInput {
  const { min, max, low, ok, high, ...rest } = m;
  return { id, kind: 'reading', ...rest, limits: { kind: 'range', min, max }, bands: bands3(min, max, { low, ok, high }) };
}

/** A Reading with one limit: at least `min` passes, or at most `max` passes; the other side fails. */
function readingOneSided(id: string, m: Measure, limit: { min: number } | { max: number }, pass: string, fail: string): StepInput {
  const isMin = 'min' in limit;
  const value = isMin ? limit.min : limit.max;
  const passBand = { id: 'within', label: isMin ? 'At or above the minimum' : 'At or below the maximum', next: pass };
  const failBand = { id: isMin ? 'below' : 'above', label: isMin ? 'Below the minimum' : 'Above the maximum', next: fail };
  return {
    id, kind: 'reading', ...m, limits: { kind: 'range', ...limit },
    bands: isMin
      ? [{ ...failBand, upper: { value, inclusive: false } }, { ...passBand, lower: { value, inclusive: true } }]
      : [{ ...passBand, upper: { value, inclusive: true } }, { ...failBand, lower: { value, inclusive: false } }],
  };
}

/** A Reading with only a minimum: below it, or at least it. */
export function readingMin(id: string, m: Measure & { min: number; low: string; ok: string }): StepInput {
  const { min, low, ok, ...rest } = m;
  return readingOneSided(id, rest, { min }, ok, low);
}

/** A Reading with only a maximum: at most it, or above it. */
export function readingMax(id: string, m: Measure & { max: number; ok: string; high: string }): StepInput {
  const { max, ok, high, ...rest } = m;
  return readingOneSided(id, rest, { max }, ok, high);
}

/** The copper-winding Formula: corrects a coil secondary reading to 20 °C (IEC 60028) and routes by limits. */
export function secondaryAt20(next: { low: string; ok: string; high: string }): StepInput {
  return {
    id: 'secondaryAt20', kind: 'formula', title: 'Secondary at 20 °C', expression: 'copper(coilSecondary, engineTemp)', quantity: 'resistance', unit: 'kΩ',
    instructions: 'The app corrects the copper winding to 20 °C (IEC 60028).', limits: { kind: 'range', min: 2500, max: 4500 },
    bands: bands3(2500, 4500, next),
  };
}

/** Builds, lays out top-down and validates a demo procedure. */
export function procedure(meta: Omit<ProcedureMeta, 'limitsNote' | 'minutesPerStep'> & { minutesPerStep?: number }, start: string, steps: StepInput[]): ProcedureDocument {
  const doc = procedureDocumentSchema.parse({ schemaVersion: CURRENT_SCHEMA_VERSION, meta: { ...meta, limitsNote: LIMITS_NOTE }, start, steps });
  return layoutTopDown(doc);
}

/** Illustrative shop meter specs, ±(% of reading + counts) at a resolution (common practice). */
export const METERS = {
  lowOhms: { percentOfReading: 1, counts: 3, resolution: 0.01 },
  ohms: { percentOfReading: 0.8, counts: 2, resolution: 0.1 },
  kiloOhms: { percentOfReading: 0.8, counts: 2, resolution: 1 },
  peakVolts: { percentOfReading: 2, counts: 5, resolution: 0.1 },
} as const satisfies Record<string, MeterSpec>;

export const FLEET = 'Larkspur Lane Powersports rental fleet: Wren 50 two-stroke scooter, Badger 110 youth quad, Heron 125 pit bike (all magneto-fed CDI).';
