import { useState } from 'react';
import { removeSetAside, retryDiagnosis, setAside, setAsideRecord, type AsideDiagnosis, type RefusedDiagnosis } from '../../../lib/offline/outbox';
import { Button } from '../../../components/ui/button';

const UNKNOWN = 'A diagnosis no longer on this phone';

/** A diagnosis the server refused: its reason, and the two ways on (send again, or set it aside). */
export function RefusedCard({ refused: r, held, current }: { refused: RefusedDiagnosis; held: string; current: boolean }) {
  const [busy, setBusy] = useState(false);
  const act = (action: (id: string) => Promise<void>) => {
    setBusy(true);
    void action(r.diagnosisId).finally(() => setBusy(false));
  };
  return (
    <div role="alert" data-testid="refused-diagnosis" className="space-y-1 rounded-lg border-2 border-stop bg-stop-soft p-3 text-ink">
      <p className="text-lg font-bold text-stop">{current ? 'This diagnosis is not reaching the server' : `Not reaching the server: ${r.label ?? UNKNOWN}`}</p>
      <p>The server refused it: {r.reason}</p>
      <p>Kept on this phone: {held}. Other diagnoses keep syncing.</p>
      <div className="flex flex-wrap gap-2 pt-1">
        <Button size="lg" busy={busy} onClick={() => act(retryDiagnosis)}>Try again</Button>
        <Button size="lg" variant="secondary" busy={busy} onClick={() => act(setAside)}>Set aside</Button>
      </div>
      <p className="text-base">Set aside stops sending it and keeps it on this phone, ready to download for your lead.</p>
    </div>
  );
}

function fileName(a: AsideDiagnosis): string {
  const words = (a.label ?? a.diagnosisId).toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '');
  return `set-aside-${words}-${a.setAsideAt.slice(0, 10)}.json`;
}

/** Saves the set-aside record as a JSON file (a Blob URL: no inline script, fits the CSP). */
async function download(a: AsideDiagnosis): Promise<void> {
  const record = await setAsideRecord(a.diagnosisId);
  const url = URL.createObjectURL(new Blob([JSON.stringify(record, null, 2)], { type: 'application/json' }));
  const link = Object.assign(document.createElement('a'), { href: url, download: fileName(a) });
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** Download, then (two taps, once the lead has the file) remove it from this phone. */
function AsideRow({ a, current }: { a: AsideDiagnosis; current: boolean }) {
  const [confirming, setConfirming] = useState(false);
  const name = a.label ?? UNKNOWN;
  return (
    <li className="space-y-2 border-t border-line pt-2 first:border-0 first:pt-0">
      <p className="font-semibold">{name}{current ? ' (this diagnosis)' : ''}</p>
      <div className="flex flex-wrap gap-2">
        <Button size="lg" variant="secondary" onClick={() => void download(a)}>
          Download<span className="sr-only"> {name}</span>
        </Button>
        {/* Not from its own screen: a step answered after removing would bring it back half-kept. */}
        {current ? null : confirming ? (
          <Button size="lg" variant="danger" onClick={() => void removeSetAside(a.diagnosisId)}>Yes, remove: my lead has the file</Button>
        ) : (
          <Button size="lg" variant="secondary" onClick={() => setConfirming(true)}>
            Remove from this phone<span className="sr-only"> {name}</span>
          </Button>
        )}
      </div>
    </li>
  );
}

/** Diagnoses set aside on this phone: not on the server, so the lead gets them as files. */
export function AsideList({ aside, current }: { aside: AsideDiagnosis[]; current?: string }) {
  const thisOne = aside.some((a) => a.diagnosisId === current);
  return (
    <section aria-label="Set aside on this phone" data-testid="set-aside" className="space-y-2 rounded-lg border-2 border-ink/60 bg-panel p-3 text-ink">
      <p className="text-lg font-bold">{thisOne ? 'This diagnosis was set aside: its record is not on the server' : 'Set aside on this phone'}</p>
      <p>{thisOne
        ? 'Steps answered from here on are kept in the file too: download it after the last one and give it to your lead to enter by hand, then remove it from this phone on the Bench home.'
        : 'Set-aside diagnoses never reached the server. Download each one and give the file to your lead to enter by hand.'}</p>
      <ul className="space-y-2">
        {aside.map((a) => <AsideRow key={a.diagnosisId} a={a} current={a.diagnosisId === current} />)}
      </ul>
    </section>
  );
}
