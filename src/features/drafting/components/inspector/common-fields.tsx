import { useCallback, useMemo } from 'react';
import { z } from 'zod';
import { stepIdSchema, type Step } from '@shared/schema';
import { Field, Input, Textarea } from '../../../../components/ui/field';
import { useStepForm } from './use-step-form';

const schema = z.object({
  title: z.string().trim().min(1, 'Give the step a title').max(120),
  id: stepIdSchema,
  instructions: z.string().max(4000),
  minutes: z.union([z.nan(), z.number().min(0).max(600)]).optional(),
});
type Values = z.infer<typeof schema>;
const pick = (s: Step): Values => ({ title: s.title, id: s.id, instructions: s.instructions, minutes: s.minutes });

/** Title, id, instructions and time estimate: what every step kind has. */
export function CommonFields({ step, takenIds, readOnly, onChange }: { step: Step; takenIds: string[]; readOnly: boolean; onChange: (s: Step) => void }) {
  const check = useCallback((v: Values) => {
    if (v.id.startsWith('_')) return { field: 'id' as const, message: 'Ids starting with _ are kept for the editor' };
    if (v.id !== step.id && takenIds.includes(v.id)) return { field: 'id' as const, message: 'Another step has this id' };
    return null;
  }, [step.id, takenIds]);
  const form = useStepForm(step, schema, pick, onChange, check);
  const { errors } = form.formState;
  const hint = useMemo(() => 'Formulas name earlier steps by this id', []);
  return (
    <fieldset disabled={readOnly} className="flex flex-col gap-3">
      <Field label="Title" error={errors.title?.message}><Input {...form.register('title')} /></Field>
      <div className="grid grid-cols-[2fr_1fr] gap-2">
        <Field label="Step id" hint={hint} error={errors.id?.message}><Input {...form.register('id')} className="font-mono" /></Field>
        <Field label="Minutes" error={errors.minutes?.message}><Input type="number" min={0} step="0.5" {...form.register('minutes', { valueAsNumber: true })} /></Field>
      </div>
      <Field label="Instructions" error={errors.instructions?.message}><Textarea {...form.register('instructions')} rows={3} /></Field>
    </fieldset>
  );
}
