// npm run perf:editor — how long one edit costs in the editor with a 500-step procedure:
// the pure reducer (with history), toFlow (what React Flow receives) and the live soundness
// check, each timed over many edits; medians and 95th percentiles in milliseconds.
import { performance } from 'node:perf_hooks';
import { lintProcedure } from '@shared/engine';
import { CURRENT_SCHEMA_VERSION, procedureDocumentSchema, type ProcedureDocument, type StepInput } from '@shared/schema';
import { historyReducer, initialHistory, type Edit, type History } from '../../src/features/drafting/lib/edits';
import { toFlow } from '../../src/features/drafting/lib/flow';

/** A chain of resistance Readings; each "below" and "above" band ends at its own Finding. */
export function generatedProcedure(steps: number): ProcedureDocument {
  const readings = Math.floor(steps / 3);
  const out: StepInput[] = [];
  for (let i = 0; i < readings; i++) {
    const next = i + 1 < readings ? `r${i + 1}` : `low${i}`;
    out.push({
      id: `r${i}`, kind: 'reading', title: `Reading ${i}`, quantity: 'resistance', unit: 'Ω', position: { x: (i % 20) * 260, y: Math.floor(i / 20) * 200 },
      limits: { kind: 'range', min: 0.2, max: 1 },
      bands: [
        { id: 'low', label: 'Below', upper: { value: 0.2, inclusive: false }, next: `low${i}` },
        { id: 'ok', label: 'Within', lower: { value: 0.2, inclusive: true }, upper: { value: 1, inclusive: true }, next },
        { id: 'high', label: 'Above', lower: { value: 1, inclusive: false }, next: `high${i}` },
      ],
    });
    out.push({ id: `low${i}`, kind: 'finding', title: `Shorted ${i}`, cause: 'Shorted winding', repair: 'Replace the coil' });
    out.push({ id: `high${i}`, kind: 'finding', title: `Open ${i}`, cause: 'Open winding', repair: 'Replace the coil' });
  }
  while (out.length < steps) out.push({ id: `spare${out.length}`, kind: 'handoff', title: 'Spare', reason: 'Unreachable on purpose' });
  return procedureDocumentSchema.parse({ schemaVersion: CURRENT_SCHEMA_VERSION, meta: { title: 'Generated', symptom: 'No spark', ignitionSystem: 'magneto-cdi' }, start: 'r0', steps: out });
}

const median = (xs: number[]) => { const s = [...xs].sort((a, b) => a - b); return s[Math.floor(s.length / 2)]!; };
const p95 = (xs: number[]) => { const s = [...xs].sort((a, b) => a - b); return s[Math.floor(s.length * 0.95)]!; };

function editAt(i: number, doc: ProcedureDocument): Edit {
  const step = doc.steps[(i * 7) % doc.steps.length]!;
  if (i % 3 === 0) return { type: 'move-steps', moves: [{ id: step.id, position: { x: step.position.x + 10, y: step.position.y } }] };
  if (i % 3 === 1) return { type: 'update-step', id: step.id, step: { ...step, title: `${step.title}.` } };
  return { type: 'connect', from: `r${i % 100}`, handle: 'band:high', to: `low${(i + 1) % 100}` };
}

function run(size: number, rounds: number): void {
  let h: History = initialHistory(generatedProcedure(size));
  const t = { reducer: [] as number[], toFlow: [] as number[], lint: [] as number[], total: [] as number[] };
  for (let i = 0; i < rounds; i++) {
    const a = performance.now();
    h = historyReducer(h, { type: 'edit', edit: editAt(i, h.present) });
    const b = performance.now();
    toFlow(h.present);
    const c = performance.now();
    lintProcedure(h.present);
    const d = performance.now();
    t.reducer.push(b - a); t.toFlow.push(c - b); t.lint.push(d - c); t.total.push(d - a);
  }
  const fmt = (xs: number[]) => `median ${median(xs).toFixed(3)} ms, p95 ${p95(xs).toFixed(3)} ms`;
  console.log(`${size} steps, ${rounds} edits`);
  for (const [k, xs] of Object.entries(t)) console.log(`  ${k.padEnd(8)} ${fmt(xs)}`);
}

run(500, 300);
run(2000, 100);
