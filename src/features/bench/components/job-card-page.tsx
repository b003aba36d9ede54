import { useEffect, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { PageHeader } from '../../../components/ui/card';
import { Field, Select } from '../../../components/ui/field';
import { Button } from '../../../components/ui/button';
import { benchQueries } from '../api/queries';
import { jobCardLink, qrImageFor } from '../lib/job-card';

/** The QR image of a link, made once the link is complete; null while it is drawn. */
function useQrImage(link: string | null): string | null {
  const [image, setImage] = useState<{ link: string; src: string } | null>(null);
  useEffect(() => {
    if (!link) return;
    let live = true;
    void qrImageFor(link).then((src) => { if (live) setImage({ link, src }); });
    return () => { live = false; };
  }, [link]);
  return image && image.link === link ? image.src : null;
}

/** A printable job card whose QR code and link open the Bench with machine and procedure already picked. */
export function JobCardPage() {
  const [params, setParams] = useSearchParams();
  const vehicles = useQuery(benchQueries.vehicles());
  const procedures = useQuery(benchQueries.procedures());
  const vehicle = params.get('vehicle') ?? '';
  const procedure = params.get('procedure') ?? '';
  const link = jobCardLink(window.location.origin, vehicle, procedure);
  const qr = useQrImage(vehicle && procedure ? link : null);
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
          <div className="mt-4 flex flex-wrap items-center gap-6">
            {qr
              ? <img src={qr} alt="QR code of the link below" className="size-48 shrink-0" data-testid="job-qr" />
              : <div className="size-48 shrink-0 border-2 border-dashed border-line" aria-hidden="true" />}
            <p className="min-w-48 flex-1 text-lg">Scan with the shop phone, or type the link, to start the diagnosis.</p>
          </div>
          <p className="mt-3 break-all font-mono text-xl font-bold" data-testid="job-link">{link}</p>
        </article>
      )}
    </div>
  );
}
