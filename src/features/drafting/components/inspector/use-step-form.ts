import { useEffect, useRef } from 'react';
import { useForm, type DefaultValues, type FieldValues } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { stepSchema, type Step } from '@shared/schema';

/**
 * A react-hook-form over some fields of a step, validated by a zod schema picked from the shared
 * step schema. Valid changes are merged onto the current step and checked against the whole
 * step schema before they become an edit; changes from outside (undo, canvas) reset the form.
 */
export function useStepForm<V extends FieldValues>(
  step: Step, schema: z.ZodType<V, V>, pick: (s: Step) => V, onChange: (s: Step) => void,
  extraCheck?: (v: V) => { field: keyof V & string; message: string } | null,
) {
  const values = pick(step);
  const form = useForm<V>({ resolver: zodResolver(schema), defaultValues: values as DefaultValues<V>, mode: 'onChange' });
  const current = useRef(step);
  current.current = step;
  const seen = useRef(JSON.stringify(values));
  useEffect(() => {
    const j = JSON.stringify(values);
    if (j !== seen.current) { seen.current = j; form.reset(values); }
  });
  useEffect(() => {
    const sub = form.watch((v, info) => {
      // only what the author typed; a reset from outside must not echo back as an edit
      if (!info.name) return;
      const parsed = schema.safeParse(v);
      if (!parsed.success) return;
      const problem = extraCheck?.(parsed.data);
      if (problem) { form.setError(problem.field as never, { message: problem.message }); return; }
      // an emptied optional number (NaN from the input) removes the field
      const next: Record<string, unknown> = { ...current.current };
      for (const [k, x] of Object.entries(parsed.data)) {
        if (x === undefined || (typeof x === 'number' && Number.isNaN(x))) delete next[k];
        else next[k] = x;
      }
      const merged = stepSchema.safeParse(next);
      if (!merged.success) return;
      seen.current = JSON.stringify(pick(merged.data));
      if (JSON.stringify(merged.data) !== JSON.stringify(current.current)) onChange(merged.data);
    });
    return () => sub.unsubscribe();
  }, [form, schema, pick, onChange, extraCheck]);
  return form;
}
