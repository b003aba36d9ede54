import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useNavigate } from 'react-router-dom';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { procedureMetaSchema, IGNITION_SYSTEMS, type ProcedureMeta } from '@shared/schema';
import { Card, Alert } from '../../../components/ui/card';
import { Button } from '../../../components/ui/button';
import { Field, Input, Select } from '../../../components/ui/field';
import { applyServerIssues } from '../../../lib/forms';
import { createProcedure } from '../api/procedures';
import { draftingKeys } from '../api/queries';
import { IGNITION_LABELS } from './labels';

const formSchema = procedureMetaSchema.pick({ title: true, symptom: true, ignitionSystem: true });
type FormValues = Pick<ProcedureMeta, 'title' | 'symptom' | 'ignitionSystem'>;

/** Title, symptom and ignition system are enough to start; everything else is drawn in the editor. */
export function CreateProcedureForm({ onCancel }: { onCancel: () => void }) {
  const navigate = useNavigate();
  const qc = useQueryClient();
  const form = useForm<FormValues>({ resolver: zodResolver(formSchema), defaultValues: { title: '', symptom: '', ignitionSystem: 'magneto-cdi' } });
  const create = useMutation({
    mutationFn: (v: FormValues) => createProcedure(procedureMetaSchema.parse(v)),
    onSuccess: (c) => { void qc.invalidateQueries({ queryKey: draftingKeys.lists() }); navigate(`/drafting/${c.procedureId}/versions/${c.draftId}`); },
    onError: (e) => form.setError('root', { message: applyServerIssues(e, form.setError, ['meta']) }),
  });
  const { errors } = form.formState;
  return (
    <Card className="mb-4">
      <form onSubmit={form.handleSubmit((v) => create.mutate(v))} className="grid gap-3 md:grid-cols-[2fr_2fr_1fr_auto] md:items-end" noValidate>
        <Field label="Title" error={errors.title?.message}><Input {...form.register('title')} placeholder="No spark at the plug" /></Field>
        <Field label="Symptom" error={errors.symptom?.message}><Input {...form.register('symptom')} placeholder="Engine cranks, no spark" /></Field>
        <Field label="Ignition system" error={errors.ignitionSystem?.message}>
          <Select {...form.register('ignitionSystem')}>{IGNITION_SYSTEMS.map((s) => <option key={s} value={s}>{IGNITION_LABELS[s]}</option>)}</Select>
        </Field>
        <div className="flex gap-2">
          <Button type="submit" busy={create.isPending}>Create</Button>
          <Button variant="ghost" onClick={onCancel}>Cancel</Button>
        </div>
        {errors.root?.message && <div className="md:col-span-4"><Alert>{errors.root.message}</Alert></div>}
      </form>
    </Card>
  );
}
