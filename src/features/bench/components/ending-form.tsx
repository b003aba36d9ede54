import { useState, type ReactNode } from 'react';
import { kindLabel } from '@shared/engine/kinds';
import type { StepView } from '@shared/engine/step-view';
import type { EndingOutcome, FindingOutcome } from '@shared/schema/bench';
import { SafetyBlock } from './step-card';

const input = 'mt-1 w-full rounded-lg border-2 border-ink/70 bg-panel px-3 min-h-12 text-lg font-normal';
const check = 'flex min-h-14 items-center gap-3 rounded-lg border-2 border-ink/30 bg-panel px-3 text-lg font-semibold';

interface Part { name: string; lot: string; fitted: boolean }
type FinalCheck = FindingOutcome['finalCheck'];

const FINAL_CHECKS = [['spark', 'Spark present at the tester'], ['runs', 'Engine starts and runs'], ['stops', 'Every stop path (kill switch, key) stops the engine']] as const;

function PartsFitted({ parts, onChange }: { parts: Part[]; onChange(parts: Part[]): void }) {
  return (
    <fieldset className="space-y-2">
      <legend className="text-lg font-bold">Parts fitted (with lot or date code)</legend>
      {parts.map((p, i) => (
        <div key={i} className="space-y-1 rounded-lg border border-line p-2">
          <label className={check}><input type="checkbox" className="h-7 w-7" checked={p.fitted} onChange={(e) => onChange(parts.map((x, j) => j === i ? { ...x, fitted: e.target.checked } : x))} />{p.name}</label>
          <label className="block text-base">Lot / date code
            <input className={input} value={p.lot} onChange={(e) => onChange(parts.map((x, j) => j === i ? { ...x, lot: e.target.value } : x))} />
          </label>
        </div>
      ))}
      <button type="button" className="min-h-12 rounded-lg border-2 border-ink px-4 font-semibold" onClick={() => onChange([...parts, { name: 'Other part', lot: '', fitted: true }])}>Add a part</button>
    </fieldset>
  );
}

interface FindingProps {
  view: StepView;
  parts: Part[];
  onParts(parts: Part[]): void;
  final: FinalCheck;
  onFinal(final: FinalCheck): void;
  labour: string;
  onLabour(labour: string): void;
}

/** What a Finding asks for: the parts fitted, the final check and the labour time. */
function FindingFields({ view, parts, onParts, final, onFinal, labour, onLabour }: FindingProps) {
  return (
    <>
      <p className="text-xl"><strong>Cause:</strong> {view.cause}</p>
      {view.repair && <p className="text-xl"><strong>Repair:</strong> {view.repair}</p>}
      <PartsFitted parts={parts} onChange={onParts} />
      <fieldset className="space-y-2">
        <legend className="text-lg font-bold">Final check after the repair</legend>
        {FINAL_CHECKS.map(([k, label]) => (
          <label key={k} className={check}><input type="checkbox" className="h-7 w-7" checked={final[k]} onChange={(e) => onFinal({ ...final, [k]: e.target.checked })} />{label}</label>
        ))}
      </fieldset>
      <label className="block text-lg font-bold">Labour time (minutes)
        <input className={input} inputMode="numeric" value={labour} onChange={(e) => onLabour(e.target.value.replace(/[^0-9]/g, ''))} />
      </label>
    </>
  );
}

/** A Finding: what was done, the final check and the labour; a Hand-off: the reason. */
export function EndingForm({ view, pictures, photos, onFinish }: { view: StepView; pictures?: ReactNode; photos: ReactNode; onFinish(outcome: EndingOutcome, note: string): Promise<void> }) {
  // the form's state lives here, not in the fields, so it stays while the screen around it re-renders
  const [parts, setParts] = useState<Part[]>(() => (view.parts ?? []).map((p) => ({ name: p.name, lot: '', fitted: true })));
  const [final, setFinal] = useState<FinalCheck>({ spark: false, runs: false, stops: false });
  const [labour, setLabour] = useState('');
  const [reason, setReason] = useState(view.reason ?? '');
  const [note, setNote] = useState('');
  const [busy, setBusy] = useState(false);
  const finding = view.kind === 'finding';
  const labourMinutes = Number.parseInt(labour, 10);
  const ready = finding ? Number.isFinite(labourMinutes) && labourMinutes >= 0 : reason.trim() !== '';
  const submit = async () => {
    setBusy(true);
    try {
      await onFinish(finding
        ? { partsFitted: parts.filter((p) => p.fitted).map(({ name, lot }) => ({ name, lot })), finalCheck: final, labourMinutes }
        : { reason }, note);
    } finally { setBusy(false); }
  };
  return (
    <article className="space-y-4" data-kind={view.kind} aria-labelledby="ending-title">
      <p className="text-lg font-bold uppercase tracking-wide text-signal">{kindLabel(view.kind)}</p>
      <h2 id="ending-title" className="text-2xl font-black">{view.title}</h2>
      <SafetyBlock view={view} acknowledgedAt={null} locks={false} onAcknowledge={() => undefined} />
      {pictures}
      {finding ? <FindingFields view={view} parts={parts} onParts={setParts} final={final} onFinal={setFinal} labour={labour} onLabour={setLabour} /> : (
        <label className="block text-lg font-bold">Why the machine goes to a senior technician
          <textarea className={`${input} min-h-28 py-2`} value={reason} onChange={(e) => setReason(e.target.value)} />
        </label>
      )}
      <label className="block text-lg font-bold">Note (optional)
        <textarea className={`${input} min-h-20 py-2`} value={note} onChange={(e) => setNote(e.target.value)} />
      </label>
      {photos}
      <button type="button" disabled={!ready || busy} onClick={() => void submit()}
        className="min-h-16 w-full rounded-xl bg-go px-5 text-xl font-bold text-white disabled:opacity-40">
        {finding ? 'Finish the diagnosis' : 'Hand off and notify the leads'}
      </button>
    </article>
  );
}
