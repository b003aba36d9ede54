import { describe, it, expect } from 'vitest';
import { lintProcedure, walkProcedure } from '@shared/engine';
import { joinLinked, type LinkedVersion } from '@shared/engine/link-join';
import type { LinkCatalogue } from '@shared/engine/lint';
import type { ProcedureDocument, StepInput } from '@shared/schema';
import { doc, finding, observation, ohmsReading, task } from '../fixtures';

const link = (id: string, procedure: string, extra: Partial<Record<'entry' | 'back', string>> = {}): StepInput =>
  ({ id, kind: 'link', title: `Continue in ${procedure}`, procedure, ...extra }) as StepInput;

// The caller measures the coil, continues in "cap-check" and, if that returns, measures again.
const caller = doc([
  ohmsReading('coil', 0.2, 1, { low: 'shorted', ok: 'toCap', high: 'shorted' }),
  link('toCap', 'cap-check', { back: 'ratio' }),
  { id: 'ratio', kind: 'formula', title: 'Coil again', expression: 'coil * 2', quantity: 'resistance', unit: 'Ω', next: 'done' },
  finding('shorted'),
  finding('done'),
]);
const capCheck = doc([
  task('prep', 'look'),
  observation('look', { bad: 'capBad', fine: 'capFine' }),
  finding('capBad'),
  { ...finding('capFine'), returns: true } as StepInput,
]);
const versions: Record<string, LinkedVersion> = {
  'cap-check': { slug: 'cap-check', title: 'Cap check', versionId: 'v-cap', number: 3, document: capCheck },
};

describe('joining linked procedures into one walk', () => {
  it('continues in the other procedure and comes back to the chosen step when it reaches a returning Finding', () => {
    const { document, linked } = joinLinked(caller, 'caller', (slug) => versions[slug]);
    expect(linked.map((l) => l.versionId)).toEqual(['v-cap']);
    const state = walkProcedure(document, [
      { stepId: 'coil', answer: { kind: 'reading', text: '0.5' } },
      { stepId: 'k1_prep', answer: { kind: 'task' } },
      { stepId: 'k1_look', answer: { kind: 'observation', answerId: 'fine' } },
    ]);
    // The value measured before the hop is still there after the return: the Formula uses it.
    expect(state.path.map((p) => p.stepId)).toEqual(['coil', 'toCap', 'k1_prep', 'k1_look', 'k1_capFine', 'ratio', 'done']);
    expect(state.values.ratio?.value).toBeCloseTo(1);
    expect(state.status).toBe('ended');
  });

  it('ends the diagnosis in the other procedure at a Finding that does not return', () => {
    const { document } = joinLinked(caller, 'caller', (slug) => versions[slug]);
    const state = walkProcedure(document, [
      { stepId: 'coil', answer: { kind: 'reading', text: '0.5' } },
      { stepId: 'k1_prep', answer: { kind: 'task' } },
      { stepId: 'k1_look', answer: { kind: 'observation', answerId: 'bad' } },
    ]);
    expect(state.ending?.id).toBe('k1_capBad');
  });

  it('begins at the chosen step of the other procedure', () => {
    const entry = doc([link('go', 'cap-check', { entry: 'look' })]);
    const { document } = joinLinked(entry, 'entry', (slug) => versions[slug]);
    expect(walkProcedure(document, []).current?.id).toBe('k1_look');
  });

  it('stops with a message when the other procedure is not at hand', () => {
    const state = walkProcedure(doc([link('go', 'cap-check')]), []);
    expect(state.status).toBe('stuck');
    expect(state.problem?.message).toMatch(/cap-check/);
  });
});

function catalogue(self: string, docs: Record<string, ProcedureDocument | null>): LinkCatalogue {
  return {
    self,
    procedures: new Map(Object.entries(docs).map(([slug, d]) => [slug, d ? { title: slug, state: 'published', document: d } : { title: slug, state: 'unpublished' }])),
  };
}

const codes = (d: ProcedureDocument, c: LinkCatalogue) => lintProcedure(d, { links: c }).findings.map((f) => f.code);

describe('the soundness check of links', () => {
  it('is sound for a link to a published procedure with a way back', () => {
    expect(codes(caller, catalogue('caller', { 'cap-check': capCheck }))).toEqual([]);
  });

  it('flags a missing target, an unpublished target and a missing entry step', () => {
    expect(codes(caller, catalogue('caller', {}))).toContain('link-target-missing');
    expect(codes(caller, catalogue('caller', { 'cap-check': null }))).toContain('link-target-unpublished');
    const badEntry = doc([link('go', 'cap-check', { entry: 'nowhere' })]);
    expect(codes(badEntry, catalogue('x', { 'cap-check': capCheck }))).toContain('link-entry-missing');
  });

  it('flags a chain of links that comes back round: a → b → a', () => {
    const a = doc([link('toB', 'b')]);
    const b = doc([link('toA', 'a')]);
    const found = lintProcedure(a, { links: catalogue('a', { a, b }) }).findings.find((f) => f.code === 'link-cycle');
    expect(found?.message).toContain('a → b → a');
  });

  it('treats a link without a way back as an ending, and its way back as a branch', () => {
    expect(lintProcedure(doc([link('go', 'cap-check')])).findings.map((f) => f.code)).toEqual([]);
    expect(lintProcedure(doc([link('go', 'cap-check', { back: 'gone' })])).findings.map((f) => f.code)).toContain('dangling-branch');
  });
});
