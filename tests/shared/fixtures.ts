import { CURRENT_SCHEMA_VERSION, procedureDocumentSchema, type ProcedureDocument, type ProcedureDocumentInput, type StepInput } from '@shared/schema';

/** Builds a parsed document from steps; the first step is the start unless told otherwise. */
export function doc(steps: StepInput[], start?: string): ProcedureDocument {
  const input: ProcedureDocumentInput = {
    schemaVersion: CURRENT_SCHEMA_VERSION,
    meta: { title: 'Test', symptom: 'No spark', ignitionSystem: 'magneto-cdi' },
    start: start ?? steps[0]!.id,
    steps,
  };
  return procedureDocumentSchema.parse(input);
}

export const finding = (id: string, repair = 'Replace the part'): StepInput => ({
  id, kind: 'finding', title: `Finding ${id}`, cause: 'A cause', repair,
});
export const handoff = (id: string): StepInput => ({ id, kind: 'handoff', title: 'Hand off', reason: 'Needs a senior technician' });
export const task = (id: string, next?: string): StepInput => ({ id, kind: 'task', title: `Task ${id}`, next });
export const observation = (id: string, answers: Record<string, string>): StepInput => ({
  id, kind: 'observation', title: `Look ${id}`, question: 'What do you see?',
  answers: Object.entries(answers).map(([aid, next]) => ({ id: aid, label: aid, next })),
});

/** A resistance Reading with limits min..max Ω and the three usual bands. */
export function ohmsReading(id: string, min: number, max: number, next: { low: string; ok: string; high: string }): StepInput {
  return {
    id, kind: 'reading', title: `Measure ${id}`, quantity: 'resistance', unit: 'Ω',
    limits: { kind: 'range', min, max },
    bands: [
      { id: 'low', label: 'Below', upper: { value: min, inclusive: false }, next: next.low },
      { id: 'ok', label: 'Within', lower: { value: min, inclusive: true }, upper: { value: max, inclusive: true }, next: next.ok },
      { id: 'high', label: 'Above', lower: { value: max, inclusive: false }, next: next.high },
    ],
  };
}
