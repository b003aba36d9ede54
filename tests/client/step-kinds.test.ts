import { describe, it, expect } from 'vitest';
import { STEP_KINDS, type ProcedureDocument, type Step, type StepInput, type StepKind } from '@shared/schema';
import { STEP_TRAITS, branchesOf, retarget, UNCONNECTED } from '@shared/engine/kinds';
import { DEMO_PROCEDURES } from '../../content';
import { doc, finding, handoff, observation, ohmsReading, task } from '../shared/fixtures';
import { toFlow } from '../../src/features/drafting/lib/flow';
import { stepFor } from '../../src/features/drafting/lib/new-step';
import { KIND_EDITORS } from '../../src/features/drafting/kinds';
import { ANSWER_CONTROLS } from '../../src/features/bench/components/answer-controls';

// Every step kind has one home: its traits in shared/engine/kinds/<kind>.ts, its editor in
// src/features/drafting/kinds.tsx, its phone control in src/features/bench/components/answer-controls.tsx.

/** One step of every kind, with every branch it can carry: bands, borderline, answers, next. */
function everyKind(): ProcedureDocument {
  return doc([
    { ...ohmsReading('coil', 0.2, 1, { low: 'cap', ok: 'look', high: 'done' }), borderline: { action: 'branch', next: 'senior', label: 'On the edge' } } as StepInput,
    observation('look', { yes: 'wipe', no: 'done' }),
    task('wipe', 'cap'),
    {
      id: 'cap', kind: 'formula', title: 'Ratio', expression: '2', quantity: 'ratio', unit: '', next: 'senior',
      bands: [{ id: 'all', label: 'Any', next: 'done' }],
    },
    finding('done'),
    handoff('senior'),
  ]);
}

describe('step kinds, each in one place', () => {
  it('every step kind has its traits, its editor and its phone control, under its own key', () => {
    for (const kind of STEP_KINDS) {
      expect(STEP_TRAITS[kind].kind).toBe(kind);
      expect(STEP_TRAITS[kind].label).not.toBe('');
      expect(KIND_EDITORS[kind].fresh('x1', { x: 0, y: 0 }).kind).toBe(kind);
      expect(kind in ANSWER_CONTROLS).toBe(true);
    }
    expect(Object.keys(STEP_TRAITS).sort()).toEqual([...STEP_KINDS].sort());
    expect(Object.keys(KIND_EDITORS).sort()).toEqual([...STEP_KINDS].sort());
    expect(Object.keys(ANSWER_CONTROLS).sort()).toEqual([...STEP_KINDS].sort());
  });

  it('the phone has a control for exactly the kinds a technician answers', () => {
    for (const kind of STEP_KINDS) expect(ANSWER_CONTROLS[kind] !== null).toBe(STEP_TRAITS[kind].arrival.on === 'answer');
  });

  it('a table keyed by step kind does not compile when a kind is missing', () => {
    // A fake extra kind: were 'probe' added to STEP_KINDS, every such table would be refused like this.
    // @ts-expect-error 'probe' has no traits
    const withProbe: { readonly [K in StepKind | 'probe']: unknown } = STEP_TRAITS;
    expect(withProbe).toBe(STEP_TRAITS);
  });

  it('the canvas draws a handle for every branch of every kind, so no branch is hidden from the author', () => {
    // A Formula with both bands and a next (a soundness error) used to lose its next handle on the canvas.
    const docs = [everyKind(), ...DEMO_PROCEDURES.map((p) => p.document)];
    for (const d of docs) {
      const { nodes } = toFlow(d);
      for (const step of d.steps) {
        const drawn = nodes.find((n) => n.id === step.id)!.data.handles.map((h) => h.id);
        for (const b of branchesOf(step)) expect(drawn, `${step.id} ${b.handle}`).toContain(b.handle);
      }
    }
  });

  it('a new step of every kind draws its handles open, and each has a branch once connected', () => {
    const base = everyKind();
    for (const kind of STEP_KINDS) {
      const step = stepFor(base, kind, { x: 0, y: 0 });
      const { nodes } = toFlow({ ...base, steps: [...base.steps, step] });
      const handles = nodes.find((n) => n.id === step.id)!.data.handles;
      expect(handles.every((h) => h.open), kind).toBe(true);
      expect(handles.length > 0, kind).toBe(STEP_TRAITS[kind].arrival.on !== 'end');
    }
  });

  it('retargeting a removed step clears every branch to it in every kind, the borderline back to re-measure', () => {
    const cleared = everyKind().steps.map((s) => retarget(retarget(s, 'done', undefined), 'senior', undefined));
    const byId = new Map<string, Step>(cleared.map((s) => [s.id, s]));
    for (const s of cleared) for (const b of branchesOf(s)) expect(['done', 'senior']).not.toContain(b.to);
    const coil = byId.get('coil')!;
    expect(coil.kind === 'reading' && coil.borderline).toEqual({ action: 're-measure', attempts: 1 });
    expect(coil.kind === 'reading' && coil.bands.find((b) => b.id === 'high')!.next).toBe(UNCONNECTED);
    const cap = byId.get('cap')!;
    expect(cap.kind === 'formula' && cap.next).toBeUndefined();
  });

  it('renaming a step keeps the borderline branch and its label', () => {
    const coil = retarget(everyKind().steps[0]!, 'senior', 'seniorTech');
    expect(coil.kind === 'reading' && coil.borderline).toEqual({ action: 'branch', next: 'seniorTech', label: 'On the edge' });
  });
});
