import { useQuery } from '@tanstack/react-query';
import type { LinkStep, Step } from '@shared/schema';
import { Field, Input, Select } from '../../../../components/ui/field';
import { draftingQueries } from '../../api/queries';
import { TargetSelect } from './target-select';

/**
 * A "Continue in" step: which procedure of the shop the diagnosis goes on in, where in it, and
 * where (if anywhere) a Finding marked "returns" brings it back in this one.
 */
export function LinkFields({ step, stepIds, readOnly, onChange }: { step: LinkStep; stepIds: string[]; readOnly: boolean; onChange: (s: Step) => void }) {
  const list = useQuery(draftingQueries.list({ q: '', status: 'published', archived: false }));
  const options = list.data ?? [];
  const known = options.some((p) => p.slug === step.procedure);
  return (
    <fieldset disabled={readOnly} className="flex flex-col gap-3">
      <Field label="Continue in procedure" hint="A published procedure of this shop">
        <Select value={step.procedure} onChange={(e) => onChange({ ...step, procedure: e.target.value })}>
          {!known && <option value={step.procedure}>{step.procedure}</option>}
          {options.map((p) => <option key={p.id} value={p.slug}>{p.title}</option>)}
        </Select>
      </Field>
      <Field label="Begin at step (id)" hint="Leave empty to begin at its first step">
        <Input value={step.entry ?? ''} onChange={(e) => {
          const { entry: _drop, ...rest } = step;
          const v = e.target.value.trim();
          onChange(v === '' ? rest : { ...rest, entry: v });
        }} />
      </Field>
      <TargetSelect label="Come back here when it returns" value={step.back ?? '_unconnected'} stepIds={stepIds}
        onChange={(back) => {
          const { back: _drop, ...rest } = step;
          onChange(back === '_unconnected' ? rest : { ...rest, back });
        }} />
    </fieldset>
  );
}
