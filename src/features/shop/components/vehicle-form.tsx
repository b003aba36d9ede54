import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { useQueryClient } from '@tanstack/react-query';
import { VehicleInput, type VehicleDto } from '@shared/schema/vehicle';
import { checkVin } from '@shared/vin';
import { api } from '../../../lib/api-client';
import { applyServerIssues } from '../../../lib/forms';
import { Field, Input, Textarea } from '../../../components/ui/field';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/card';
import { shopKeys } from '../api/queries';

// The form edits hours as text so that an empty box means "not known".
const FormSchema = VehicleInput.extend({
  hours: z.string().trim().refine((s) => s === '' || (!Number.isNaN(Number(s.replace(',', '.'))) && Number(s.replace(',', '.')) >= 0), 'Enter hours as a number, e.g. 312.5'),
});
type FormValues = z.input<typeof FormSchema>;

function VinHint({ value }: { value: string }) {
  const r = checkVin(value ?? '');
  if (r.kind === 'frame-number') return <>17 characters are checked as a VIN (49 CFR 565); shorter frame numbers are kept as typed.</>;
  return r.ok ? <span className="font-semibold text-go">VIN check digit is correct.</span> : null;
}

/** Create or edit one machine; the VIN check digit is checked as the technician types. */
export function VehicleForm({ vehicle, onDone }: { vehicle?: VehicleDto; onDone: () => void }) {
  const qc = useQueryClient();
  const [formError, setFormError] = useState('');
  const { register, handleSubmit, setError, watch, formState: { errors, isSubmitting } } = useForm<FormValues>({
    resolver: zodResolver(FormSchema),
    mode: 'onChange',
    defaultValues: {
      label: vehicle?.label ?? '', model: vehicle?.model ?? '', frameNumber: vehicle?.frameNumber ?? '',
      hours: vehicle?.hours === null || vehicle?.hours === undefined ? '' : String(vehicle.hours), notes: vehicle?.notes ?? '',
    },
  });
  const onSubmit = handleSubmit(async (v) => {
    setFormError('');
    const body = { ...v, hours: v.hours === '' ? null : Number(String(v.hours).replace(',', '.')) };
    try {
      if (vehicle) await api.put(`/api/vehicles/${vehicle.id}`, body);
      else await api.post('/api/vehicles', body);
      void qc.invalidateQueries({ queryKey: [...shopKeys.all, 'vehicles'] });
      onDone();
    } catch (err) {
      setFormError(applyServerIssues(err, setError, ['label', 'model', 'frameNumber', 'hours', 'notes']));
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-3 sm:grid-cols-2">
      {formError && <div className="sm:col-span-2"><Alert>{formError}</Alert></div>}
      <Field label="Label" hint="The fleet or job number painted on the machine." error={errors.label?.message}><Input {...register('label')} /></Field>
      <Field label="Model" error={errors.model?.message}><Input {...register('model')} /></Field>
      <Field label="Frame number or VIN" hint={<VinHint value={watch('frameNumber') ?? ''} />} error={errors.frameNumber?.message}>
        <Input autoCapitalize="characters" spellCheck={false} {...register('frameNumber')} />
      </Field>
      <Field label="Hours" error={errors.hours?.message}><Input inputMode="decimal" {...register('hours')} /></Field>
      <Field label="Notes" className="sm:col-span-2" error={errors.notes?.message}><Textarea {...register('notes')} /></Field>
      <div className="flex gap-2 sm:col-span-2">
        <Button type="submit" busy={isSubmitting}>{vehicle ? 'Save machine' : 'Add machine'}</Button>
        <Button variant="ghost" onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}
