import { useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { Button } from '../../../components/ui/button';
import { Field, Select, Textarea } from '../../../components/ui/field';
import { useAddCoachingNote } from '../api/mutations';

/** A coaching note on the whole diagnosis or on one of its steps; the technician reads it in their history. */
export function CoachingForm({ diagnosisId, steps, stepId, onStep }: {
  diagnosisId: string; steps: { id: string; title: string }[]; stepId: string | null; onStep: (id: string | null) => void;
}) {
  const [body, setBody] = useState('');
  const add = useAddCoachingNote(diagnosisId);
  const issue = add.error instanceof ApiError ? add.error : null;
  const bodyError = issue?.issues?.find((i) => i.path === 'body')?.message;
  return (
    <form className="flex flex-col gap-3" onSubmit={(e) => {
      e.preventDefault();
      add.mutate({ body, stepId }, { onSuccess: () => setBody('') });
    }}>
      <Field label="About">
        <Select value={stepId ?? ''} onChange={(e) => onStep(e.target.value || null)}>
          <option value="">The whole diagnosis</option>
          {steps.map((s) => <option key={s.id} value={s.id}>Step: {s.title}</option>)}
        </Select>
      </Field>
      <Field label="Coaching note" hint="The technician sees it in their own history." error={bodyError}>
        <Textarea value={body} onChange={(e) => setBody(e.target.value)} maxLength={4000} rows={3} />
      </Field>
      {issue && !bodyError && <p role="alert" className="font-semibold text-stop">{issue.message}</p>}
      {add.isSuccess && <p role="status" className="text-go">Note saved.</p>}
      <div><Button type="submit" busy={add.isPending} disabled={!body.trim()}>Add note</Button></div>
    </form>
  );
}
