import { z } from 'zod';
import { findingStepSchema, handoffStepSchema, observationStepSchema, taskStepSchema, type Step } from '@shared/schema';
import { Field, Input, Textarea } from '../../../../components/ui/field';
import { useStepForm } from './use-step-form';

// The plain text fields of each kind, as react-hook-form forms validated by the shared schema.

const findingSchema = findingStepSchema.pick({ cause: true, repair: true });
const handoffSchema = handoffStepSchema.pick({ reason: true });
const observationSchema = observationStepSchema.pick({ question: true });
const taskSchema = taskStepSchema.pick({ confirmLabel: true });
type Props = { step: Step; readOnly: boolean; onChange: (s: Step) => void };

const pickFinding = (s: Step) => (s.kind === 'finding' ? { cause: s.cause, repair: s.repair } : { cause: '', repair: '' });
export function FindingText({ step, readOnly, onChange }: Props) {
  const form = useStepForm(step, findingSchema as z.ZodType<z.infer<typeof findingSchema>, z.infer<typeof findingSchema>>, pickFinding, onChange);
  const e = form.formState.errors;
  return (
    <fieldset disabled={readOnly} className="flex flex-col gap-3">
      <Field label="Cause" error={e.cause?.message}><Textarea {...form.register('cause')} rows={2} /></Field>
      <Field label="Repair" hint="A Finding without a repair draws a warning" error={e.repair?.message}><Textarea {...form.register('repair')} rows={3} /></Field>
    </fieldset>
  );
}

const pickHandoff = (s: Step) => ({ reason: s.kind === 'handoff' ? s.reason : '' });
export function HandoffText({ step, readOnly, onChange }: Props) {
  const form = useStepForm(step, handoffSchema, pickHandoff, onChange);
  return (
    <fieldset disabled={readOnly}>
      <Field label="Reason for the hand-off" error={form.formState.errors.reason?.message}><Textarea {...form.register('reason')} rows={3} /></Field>
    </fieldset>
  );
}

const pickObservation = (s: Step) => ({ question: s.kind === 'observation' ? s.question : '' });
export function ObservationText({ step, readOnly, onChange }: Props) {
  const form = useStepForm(step, observationSchema, pickObservation, onChange);
  return (
    <fieldset disabled={readOnly}>
      <Field label="Question" error={form.formState.errors.question?.message}><Input {...form.register('question')} /></Field>
    </fieldset>
  );
}

const pickTask = (s: Step) => (s.kind === 'task' ? { confirmLabel: s.confirmLabel } : { confirmLabel: 'Done' });
export function TaskText({ step, readOnly, onChange }: Props) {
  const form = useStepForm(step, taskSchema as z.ZodType<z.infer<typeof taskSchema>, z.infer<typeof taskSchema>>, pickTask, onChange);
  return (
    <fieldset disabled={readOnly}>
      <Field label="Confirm button" error={form.formState.errors.confirmLabel?.message}><Input {...form.register('confirmLabel')} /></Field>
    </fieldset>
  );
}
