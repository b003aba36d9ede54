import type { ReactNode } from 'react';
import type { Position, ProcedureDocument, Step, StepKind } from '@shared/schema';
import { UNCONNECTED, type StepOf } from '@shared/engine/kinds';
import { FormulaFields } from './components/inspector/formula-fields';
import { AnswersEditor, PartsEditor } from './components/inspector/list-editors';
import { LinkFields } from './components/inspector/link-fields';
import { ReadingFields } from './components/inspector/reading-fields';
import { TargetSelect } from './components/inspector/target-select';
import { FindingText, HandoffText, ObservationText, TaskText } from './components/inspector/text-fields';

/** ISO 5807 outline: decisions are diamonds, endings terminators, the rest processes. */
export type Outline = 'process' | 'decision' | 'terminal';

export interface FieldsProps<S extends Step> {
  step: S;
  doc: ProcedureDocument;
  stepIds: string[];
  readOnly: boolean;
  update: (s: Step) => void;
}

/** What Drafting needs to know about one step kind (the engine's side is `STEP_TRAITS` in shared/). */
export interface KindEditor<K extends StepKind> {
  /** The palette's one-line hint. */
  readonly hint: string;
  /** Our own glyph, an SVG path on a 20×20 grid. */
  readonly glyph: string;
  readonly outline: Outline;
  /** Our colours (fill, stroke, text class), from the design tokens. */
  readonly tone: { readonly fill: string; readonly stroke: string; readonly text: string };
  /** New ids are `<baseName><n>`; ids name steps in Formulas, so keep it short. */
  readonly baseName: string;
  /** A new step as the palette drops it: sensible defaults, branches not yet connected. */
  fresh(id: string, position: Position): StepOf<K>;
  /** The inspector's fields for the kind (below the common ones, above safety). */
  Fields(props: FieldsProps<StepOf<K>>): ReactNode;
}

const common = { instructions: '', safety: [], hazards: [] };

/** Every kind's editor, keyed by kind: a kind left out does not compile. */
export const KIND_EDITORS: { readonly [K in StepKind]: KindEditor<K> } = {
  reading: {
    hint: 'Measure a value; bands branch',
    glyph: 'M3 14a7 7 0 0 1 14 0M10 14l4-5M10 14h0',
    outline: 'decision',
    tone: { fill: 'var(--color-signal-soft)', stroke: 'var(--color-signal)', text: 'text-signal' },
    baseName: 'reading',
    fresh: (id, position) => ({
      ...common, id, position, kind: 'reading', title: 'New reading', quantity: 'resistance', unit: 'Ω',
      limits: { kind: 'range', min: 0.2, max: 1 }, decision: 'simple', borderline: { action: 're-measure', attempts: 1 }, leadNull: false,
      bands: [
        { id: 'below', label: 'Below limits', upper: { value: 0.2, inclusive: false }, next: UNCONNECTED },
        { id: 'within', label: 'Within limits', lower: { value: 0.2, inclusive: true }, upper: { value: 1, inclusive: true }, next: UNCONNECTED },
        { id: 'above', label: 'Above limits', lower: { value: 1, inclusive: false }, next: UNCONNECTED },
      ],
    }),
    Fields: ({ step, stepIds, readOnly, update }) => <ReadingFields step={step} stepIds={stepIds} readOnly={readOnly} onChange={update} />,
  },
  observation: {
    hint: 'Ask what they see; answers branch',
    glyph: 'M2 10c2.5-4 5-6 8-6s5.5 2 8 6c-2.5 4-5 6-8 6s-5.5-2-8-6zM10 12.5a2.5 2.5 0 1 0 0-5 2.5 2.5 0 0 0 0 5z',
    outline: 'decision',
    tone: { fill: '#e3edf8', stroke: 'var(--color-notice)', text: 'text-notice' },
    baseName: 'observation',
    fresh: (id, position) => ({
      ...common, id, position, kind: 'observation', title: 'New observation', question: 'What do you see?',
      answers: [{ id: 'yes', label: 'Yes', next: UNCONNECTED }, { id: 'no', label: 'No', next: UNCONNECTED }],
    }),
    Fields: ({ step, stepIds, readOnly, update }) => (
      <>
        <ObservationText step={step} readOnly={readOnly} onChange={update} />
        <AnswersEditor answers={step.answers} stepIds={stepIds} disabled={readOnly} onChange={(answers) => update({ ...step, answers })} />
      </>
    ),
  },
  task: {
    hint: 'Do something and confirm',
    glyph: 'M4 10.5l4 4 8-9',
    outline: 'process',
    tone: { fill: 'var(--color-panel)', stroke: 'var(--color-ink)', text: 'text-ink' },
    baseName: 'task',
    fresh: (id, position) => ({ ...common, id, position, kind: 'task', title: 'New task', confirmLabel: 'Done' }),
    Fields: ({ step, stepIds, readOnly, update }) => (
      <>
        <TaskText step={step} readOnly={readOnly} onChange={update} />
        <fieldset disabled={readOnly}><TargetSelect label="Next step" value={step.next ?? UNCONNECTED} stepIds={stepIds} onChange={(next) => update({ ...step, next })} /></fieldset>
      </>
    ),
  },
  formula: {
    hint: 'Compute from earlier readings',
    glyph: 'M13 3.5c-2 0-3 1-3.4 3L7.6 16.5c-.4 2-1.4 3-3.1 3M5.5 9h7',
    outline: 'process',
    tone: { fill: '#eef0f2', stroke: 'var(--color-ink-soft)', text: 'text-ink-soft' },
    baseName: 'formula',
    fresh: (id, position) => ({ ...common, id, position, kind: 'formula', title: 'New formula', expression: '1', quantity: 'ratio', unit: '', bands: [] }),
    Fields: ({ step, doc, stepIds, readOnly, update }) => <FormulaFields step={step} doc={doc} stepIds={stepIds} readOnly={readOnly} onChange={update} />,
  },
  finding: {
    hint: 'End with cause and repair',
    glyph: 'M5 18V3M5 3h10l-2.5 3.5L15 10H5',
    outline: 'terminal',
    tone: { fill: 'var(--color-go-soft)', stroke: 'var(--color-go)', text: 'text-go' },
    baseName: 'finding',
    fresh: (id, position) => ({ ...common, id, position, kind: 'finding', title: 'New finding', cause: 'Describe the cause', repair: '', parts: [], returns: false }),
    Fields: ({ step, readOnly, update }) => (
      <>
        <FindingText step={step} readOnly={readOnly} onChange={update} />
        <label className="flex min-h-11 items-center gap-2 text-sm">
          <input type="checkbox" className="h-5 w-5" checked={step.returns} disabled={readOnly} onChange={(e) => update({ ...step, returns: e.target.checked })} />
          Returns to the procedure that continued here (when it asked to come back)
        </label>
        <PartsEditor parts={step.parts} disabled={readOnly} onChange={(parts) => update({ ...step, parts })} />
      </>
    ),
  },
  handoff: {
    hint: 'End by handing to a senior',
    glyph: 'M3 10h11M10 5l5 5-5 5M17 4v12',
    outline: 'terminal',
    tone: { fill: 'var(--color-edge-soft)', stroke: 'var(--color-edge)', text: 'text-edge' },
    baseName: 'handoff',
    fresh: (id, position) => ({ ...common, id, position, kind: 'handoff', title: 'Hand to a senior technician', reason: 'Describe why' }),
    Fields: ({ step, readOnly, update }) => <HandoffText step={step} readOnly={readOnly} onChange={update} />,
  },
  link: {
    hint: 'Go on in another procedure',
    glyph: 'M3 10h6M9 6l4 4-4 4M13 4h4v12h-4',
    outline: 'process',
    tone: { fill: 'var(--color-signal-soft)', stroke: 'var(--color-ink)', text: 'text-ink' },
    baseName: 'continueIn',
    fresh: (id, position) => ({ ...common, id, position, kind: 'link', title: 'Continue in another procedure', procedure: 'choose-a-procedure' }),
    Fields: ({ step, stepIds, readOnly, update }) => <LinkFields step={step} stepIds={stepIds} readOnly={readOnly} onChange={update} />,
  },
};

/** The editor of a step's kind, typed for that step (one cast: TypeScript cannot follow the union into the table). */
export function editorOf<S extends Step>(step: S): KindEditor<S['kind']> {
  return KIND_EDITORS[step.kind] as unknown as KindEditor<S['kind']>;
}
