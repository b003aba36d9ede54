import { useCallback } from 'react';
import type { ProcedureDocument, Step } from '@shared/schema';
import { Button } from '../../../../components/ui/button';
import type { Edit } from '../../lib/edits';
import { KIND_LABELS } from '../labels';
import { StepGlyph, KIND_TONE } from '../editor/step-glyphs';
import { CommonFields } from './common-fields';
import { SafetyEditor } from './safety-editor';
import { PicturesEditor } from './pictures-editor';
import type { VersionIds } from '../../api/versions';
import { editorOf } from '../../kinds';

function KindFields({ step, ...rest }: { step: Step; doc: ProcedureDocument; stepIds: string[]; readOnly: boolean; update: (s: Step) => void }) {
  const { Fields } = editorOf(step);
  return <Fields step={step} {...rest} />;
}

/** The form for the selected step; every change is one `update-step` edit (undoable). */
export function Inspector({ ids, step, doc, readOnly, onEdit }: { ids: VersionIds; step: Step; doc: ProcedureDocument; readOnly: boolean; onEdit: (e: Edit) => void }) {
  const update = useCallback((next: Step) => onEdit({ type: 'update-step', id: step.id, step: next }), [onEdit, step.id]);
  const stepIds = doc.steps.map((s) => s.id).filter((id) => id !== step.id);
  return (
    <section aria-label={`Step ${step.title}`} className="flex flex-col gap-4" data-testid="inspector">
      <header className="flex items-center justify-between gap-2">
        <h2 className={`flex items-center gap-2 text-lg font-bold ${KIND_TONE[step.kind].text}`}><StepGlyph kind={step.kind} />{KIND_LABELS[step.kind]}</h2>
        {!readOnly && (
          <div className="flex gap-1">
            {doc.start !== step.id && <Button variant="ghost" onClick={() => onEdit({ type: 'set-start', id: step.id })}>Start here</Button>}
            <Button variant="ghost" className="text-stop" onClick={() => onEdit({ type: 'remove-steps', ids: [step.id] })}>Delete</Button>
          </div>
        )}
      </header>
      <CommonFields step={step} takenIds={stepIds} readOnly={readOnly} onChange={update} />
      <KindFields step={step} doc={doc} stepIds={stepIds} readOnly={readOnly} update={update} />
      <SafetyEditor notes={step.safety} hazards={step.hazards} disabled={readOnly} onChange={(v) => update({ ...step, ...v })} />
      <PicturesEditor ids={ids} step={step} readOnly={readOnly} onChange={update} />
    </section>
  );
}
