import { useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { PageHeader } from '../../../components/ui/card';
import { Field, Select } from '../../../components/ui/field';
import { Button } from '../../../components/ui/button';
import { benchQueries } from '../api/queries';

/** A printable job card whose link opens the Bench with machine and procedure already picked. */
export function JobCardPage() {
  const [params, setParams] = useSearchParams();
  const vehicles = useQuery(benchQueries.vehicles());
  const procedures = useQuery(benchQueries.procedures());
  const vehicle = params.get('vehicle') ?? '';
  const procedure = params.get('procedure') ?? '';
  const link = `${window.location.origin}/bench/start?vehicle=${encodeURIComponent(vehicle)}&procedure=${encodeURIComponent(procedure)}`;
  const v = vehicles.data?.find((x) => x.id === vehicle);
  const p = procedures.data?.find((x) => x.slug === procedure);
  const pick = (k: string) => (e: { target: { value: string } }) => { const n = new URLSearchParams(params); n.set(k, e.target.value); setParams(n, { replace: true }); };
  return (
    <div className="mx-auto max-w-2xl space-y-4">
      <div className="no-print space-y-3">
        <PageHeader title="Job card" />
        <Field label="Machine"><Select value={vehicle} onChange={pick('vehicle')}><option value="">Pick a machine</option>{vehicles.data?.map((x) => <option key={x.id} value={x.id}>{x.label} — {x.model}</option>)}</Select></Field>
        <Field label="Procedure"><Select value={procedure} onChange={pick('procedure')}><option value="">Pick a procedure</option>{procedures.data?.map((x) => <option key={x.slug} value={x.slug}>{x.title}</option>)}</Select></Field>
        <Button size="lg" className="min-h-14 w-full" onClick={() => window.print()} disabled={!vehicle || !procedure}>Print the job card</Button>
      </div>
      {vehicle && procedure && (
        <article className="rounded-lg border-4 border-ink bg-white p-6 text-ink">
          <h2 className="text-3xl font-black">{v?.label} · {v?.model}</h2>
          <p className="text-xl">{p?.title}</p>
          <p className="mt-4 text-lg">Open on the shop phone to start the diagnosis:</p>
          <p className="mt-2 break-all font-mono text-2xl font-bold" data-testid="job-link">{link}</p>
        </article>
      )}
    </div>
  );
}
