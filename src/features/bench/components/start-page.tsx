import { useEffect, useMemo, useState, type FormEvent } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { ApiError } from '../../../lib/api-client';
import { useSession } from '../../../lib/session';
import { PageHeader, Alert } from '../../../components/ui/card';
import { Button } from '../../../components/ui/button';
import { Field, Input, Select, Textarea } from '../../../components/ui/field';
import { LimitsNotice } from '../../../components/ui/safety';
import { benchQueries } from '../api/queries';
import type { MeterDto as Meter } from '@shared/schema/shop';
import { MachinePicker } from './machine-picker';
import { KitSizeLine } from './kit-size';
import { startDiagnosis, type StartForm } from '../lib/start';
import { filterProcedures, keepVersions } from '../lib/kit';

const IGNITION = [['', 'Any ignition'], ['magneto-cdi', 'Magneto CDI'], ['battery-cdi', 'Battery CDI'], ['magneto-inductive', 'Magneto inductive'], ['battery-inductive', 'Battery inductive']] as const;

type SetField = (k: keyof StartForm) => (e: { target: { value: string } }) => void;

function ProcedureFieldset({ slug, set }: { slug: string; set: SetField }) {
  const [filter, setFilter] = useState({ symptom: '', ignitionSystem: '' });
  const all = useQuery(benchQueries.procedures());
  const shown = useMemo(() => (all.data ? filterProcedures(all.data, filter) : undefined), [all.data, filter]);
  const [kept, setKept] = useState(0);
  // With signal, keep each published version and its pictures on the phone, so a later start needs none.
  useEffect(() => {
    if (all.data && all.isFetchedAfterMount && navigator.onLine) void keepVersions(all.data).catch(() => undefined).finally(() => setKept((n) => n + 1));
  }, [all.data, all.isFetchedAfterMount]);
  return (
    <fieldset className="space-y-3 rounded-lg border border-line bg-panel p-3">
      <legend className="px-1 text-lg font-bold">Procedure</legend>
      <Field label="Symptom"><Input value={filter.symptom} onChange={(e) => setFilter({ ...filter, symptom: e.target.value })} placeholder="e.g. no spark" /></Field>
      <Field label="Ignition system"><Select value={filter.ignitionSystem} onChange={(e) => setFilter({ ...filter, ignitionSystem: e.target.value })}>{IGNITION.map(([v, l]) => <option key={v} value={v}>{l}</option>)}</Select></Field>
      <div role="radiogroup" aria-label="Published procedures" className="grid gap-2">
        {shown?.map((p) => (
          <label key={p.slug} className="flex min-h-16 cursor-pointer items-center gap-3 rounded-lg border-2 border-ink/40 bg-paper px-3 py-2 text-lg font-semibold has-[:checked]:border-signal has-[:checked]:bg-signal-soft">
            <input type="radio" name="procedure" className="h-6 w-6 shrink-0 accent-signal" value={p.slug} checked={slug === p.slug} onChange={set('slug')} />
            <span>{p.title} <span className="block text-base font-normal text-ink-soft">{p.symptom} · version {p.number}</span></span>
          </label>
        ))}
        {shown?.length === 0 && <p>No published procedure matches.</p>}
      </div>
      <KitSizeLine refresh={kept} />
    </fieldset>
  );
}

function ConditionsFieldset({ form, meterId, meters, set }: { form: StartForm; meterId: string; meters: Meter[] | undefined; set: SetField }) {
  return (
    <fieldset className="space-y-3 rounded-lg border border-line bg-panel p-3">
      <legend className="px-1 text-lg font-bold">Complaint and conditions</legend>
      <Field label="Complaint in the customer's words"><Textarea required value={form.complaint} onChange={set('complaint')} rows={3} /></Field>
      <Field label="Engine"><Select value={form.engine} onChange={set('engine')}><option value="cold">Cold</option><option value="hot">Hot</option></Select></Field>
      <Field label="Ambient temperature (°C)"><Input inputMode="decimal" value={form.ambientC} onChange={set('ambientC')} /></Field>
      <Field label="Starting method"><Select value={form.startingMethod} onChange={set('startingMethod')}>
        <option value="kick">Kick</option><option value="pull">Pull cord</option><option value="electric">Electric start</option><option value="push">Push start</option>
      </Select></Field>
      <Field label="Battery voltage (V), where there is a battery"><Input inputMode="decimal" value={form.batteryVolts} onChange={set('batteryVolts')} /></Field>
      <Field label="Meter used"><Select value={meterId} onChange={set('meterId')}>{meters?.map((m) => <option key={m.id} value={m.id}>{m.name}</option>)}</Select></Field>
    </fieldset>
  );
}

/** Start a diagnosis: procedure, machine, complaint, conditions and the meter used. */
export function StartPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const { may } = useSession();
  const vehicles = useQuery(benchQueries.vehicles());
  const meters = useQuery(benchQueries.meters());
  const procedures = useQuery(benchQueries.procedures());
  const [form, setForm] = useState<StartForm>({
    slug: params.get('procedure') ?? '', vehicleId: params.get('vehicle') ?? '', meterId: '', complaint: '',
    engine: 'cold', ambientC: '20', startingMethod: 'kick', batteryVolts: '',
  });
  const [error, setError] = useState<string | null>(null);
  const set: SetField = (k) => (e) => setForm({ ...form, [k]: e.target.value });
  const meterId = form.meterId || meters.data?.[0]?.id || '';

  const start = async (e: FormEvent) => {
    e.preventDefault();
    setError(null);
    try {
      const listed = procedures.data?.find((p) => p.slug === form.slug)?.versionId;
      const id = await startDiagnosis(form, vehicles.data?.find((v) => v.id === form.vehicleId), meters.data?.find((m) => m.id === meterId), listed);
      navigate(`/bench/d/${id}`);
    } catch (err) {
      if (err instanceof ApiError) setError(err.message + (err.issues.length ? ` (${err.issues.map((i) => i.message).join('; ')})` : ''));
      else setError(err instanceof Error ? err.message : 'Could not start the diagnosis.');
    }
  };

  return (
    <form onSubmit={(e) => void start(e)} className="mx-auto max-w-xl space-y-4 pb-16">
      <PageHeader title="Start a diagnosis" />
      <ProcedureFieldset slug={form.slug} set={set} />
      <MachinePicker vehicles={vehicles.data} value={form.vehicleId} onChange={(vehicleId) => setForm((f) => ({ ...f, vehicleId }))} canAdd={may('vehicle.edit')} />
      <ConditionsFieldset form={form} meterId={meterId} meters={meters.data} set={set} />
      <LimitsNotice />
      {error && <Alert title="Not started">{error}</Alert>}
      <Button type="submit" size="lg" className="min-h-16 w-full text-xl" disabled={!form.slug || !form.vehicleId || !form.complaint.trim()}>Start the diagnosis</Button>
    </form>
  );
}
