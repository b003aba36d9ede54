import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { ShopSettingsInput } from '@shared/schema/shop';
import { api } from '../../../lib/api-client';
import { meQuery } from '../../../lib/session';
import { applyServerIssues } from '../../../lib/forms';
import { Field, Input } from '../../../components/ui/field';
import { Button } from '../../../components/ui/button';
import { Alert, Card, PageHeader, Spinner } from '../../../components/ui/card';
import { shopKeys, shopQueries, type ShopSettingsDto } from '../api/queries';
import { LocalePicker } from './locale-picker';

function SettingsForm({ initial }: { initial: ShopSettingsDto }) {
  const qc = useQueryClient();
  const [msg, setMsg] = useState('');
  const { register, control, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<ShopSettingsInput>({
    resolver: zodResolver(ShopSettingsInput),
    defaultValues: initial,
  });
  const onSubmit = handleSubmit(async (v) => {
    setMsg('');
    try {
      await api.put('/api/shop/settings', v);
      setMsg('Saved.');
      void qc.invalidateQueries({ queryKey: shopKeys.settings() });
      // the session carries the shop's locale to every area
      void qc.invalidateQueries({ queryKey: meQuery.queryKey });
    } catch (err) {
      setMsg(applyServerIssues(err, setError, ['name', 'settings', 'locale']));
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="grid max-w-xl gap-3">
      {msg && <Alert tone={msg === 'Saved.' ? 'go' : 'stop'}>{msg}</Alert>}
      <Field label="Shop name" error={errors.name?.message}><Input {...register('name')} /></Field>
      <Field label="Comeback window (days)" hint="A machine back within this many days counts as a comeback in Debrief." error={errors.settings?.comebackDays?.message}>
        <Input inputMode="numeric" {...register('settings.comebackDays', { valueAsNumber: true })} />
      </Field>
      <Field label="Mark a diagnosis abandoned after (hours)" error={errors.settings?.abandonAfterHours?.message}>
        <Input inputMode="decimal" {...register('settings.abandonAfterHours', { valueAsNumber: true })} />
      </Field>
      <Field label="Service desk e-mail" hint="Diagnosis reports are sent here." error={errors.settings?.serviceDeskEmail?.message}>
        <Input type="email" {...register('settings.serviceDeskEmail')} />
      </Field>
      <Controller control={control} name="locale" render={({ field }) => (
        <LocalePicker value={field.value ?? null} onChange={field.onChange} error={errors.locale?.message} />
      )} />
      <Button type="submit" busy={isSubmitting} className="justify-self-start">Save settings</Button>
    </form>
  );
}

export function SettingsPage() {
  const settings = useQuery(shopQueries.settings());
  const meters = useQuery(shopQueries.meters());
  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="Shop settings" />
      {settings.data ? <SettingsForm initial={settings.data} /> : <Spinner />}
      <Card>
        <h2 className="mb-2 text-xl">Meters</h2>
        <p className="mb-3 text-ink-soft">Accuracy as ±(% of reading + counts) at the resolution, from each meter's own data sheet.</p>
        <ul className="grid gap-3 md:grid-cols-2">
          {meters.data?.map((m) => (
            <li key={m.id} className="rounded-lg border border-line p-3">
              <p className="font-semibold">{m.name}</p>
              <ul className="text-sm text-ink-soft">
                {m.spec.entries.map((e) => <li key={e.quantity}>{e.quantity}: ±({e.percentOfReading} % + {e.counts} counts) at {e.resolution}</li>)}
              </ul>
            </li>
          ))}
        </ul>
      </Card>
    </div>
  );
}
