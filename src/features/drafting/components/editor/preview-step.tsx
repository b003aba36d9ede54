import { useState } from 'react';
import type { StepView } from '@shared/engine';
import type { WalkAnswer } from '@shared/engine';
import { SafetyNote, LimitsNotice } from '../../../../components/ui/safety';
import { Button } from '../../../../components/ui/button';
import { Input } from '../../../../components/ui/field';
import type { StepPicture } from '@shared/schema/procedure';
import { pictureUrl } from '../../../../lib/pictures/picture-url';

/**
 * The step's reference pictures as the phone shows them (the phone rendition, in order, with the
 * caption under each); the author is online, so they come from the server. A tap opens the original.
 */
export function PreviewPictures({ pictures }: { pictures: readonly StepPicture[] | undefined }) {
  if (!pictures?.length) return null;
  return (
    <section aria-label="Reference pictures" className="flex snap-x gap-3 overflow-x-auto pb-1">
      {pictures.map((p) => (
        <figure key={p.id} className={pictures.length === 1 ? 'w-full' : 'w-[72%] shrink-0 snap-start'} data-testid="preview-picture">
          <a href={pictureUrl(p.id, 'full')} target="_blank" rel="noreferrer" className="block aspect-[4/3] overflow-hidden rounded-lg border-2 border-ink/30 bg-paper" aria-label={`Open full size: ${p.caption}`}>
            <img src={pictureUrl(p.id, 'phone')} alt={p.caption} loading="lazy" decoding="async" className="h-full w-full object-contain" />
          </a>
          <figcaption className="mt-1 leading-snug">{p.caption}</figcaption>
        </figure>
      ))}
    </section>
  );
}

/**
 * A compact version of the technician's step screen, built on the shared step view: the same
 * safety notes, limits and answers the Bench shows, sized for a phone.
 */
export function PreviewStep({ view, pictures, remeasure, onAnswer }: {
  view: StepView; pictures?: readonly StepPicture[] | undefined; remeasure: boolean; onAnswer: (a: WalkAnswer, acknowledged: boolean) => void;
}) {
  const [acknowledged, setAcknowledged] = useState(false);
  const [text, setText] = useState('');
  const blocked = view.mustAcknowledge && !acknowledged;
  return (
    <div className="flex flex-col gap-3" data-testid="preview-step">
      <h3 className="text-xl font-bold leading-tight">{view.title}</h3>
      {view.safety.map((n, i) => (
        <SafetyNote key={i} signal={n.signal} action={n.signal === 'DANGER' && (
          <label className="flex min-h-12 items-center gap-2 font-semibold">
            <input type="checkbox" className="h-6 w-6" checked={acknowledged} onChange={(e) => setAcknowledged(e.target.checked)} /> I have read this
          </label>
        )}>{n.text}</SafetyNote>
      ))}
      {view.instructions && <p className="whitespace-pre-line">{view.instructions}</p>}
      <PreviewPictures pictures={pictures} />
      {view.kind === 'reading' && (
        <form className="flex flex-col gap-2" onSubmit={(e) => { e.preventDefault(); onAnswer({ kind: 'reading', text }, acknowledged); setText(''); }}>
          {view.limits && <p className="rounded-lg bg-paper p-2 text-lg">Limits: <strong>{view.limits.text}</strong></p>}
          {remeasure && <p role="status" className="rounded-lg bg-edge-soft p-2 font-semibold text-edge">Borderline: measure again.</p>}
          <label className="flex flex-col gap-1 font-semibold">Reading{view.unit ? ` (${view.unit})` : ''}
            <Input value={text} onChange={(e) => setText(e.target.value)} inputMode="decimal" className="min-h-14 text-xl" autoComplete="off" />
          </label>
          <Button type="submit" size="lg" disabled={blocked || text.trim() === ''}>Enter reading</Button>
          <LimitsNotice />
        </form>
      )}
      {view.kind === 'observation' && (
        <div className="flex flex-col gap-2">
          <p className="text-lg font-semibold">{view.question}</p>
          {view.answers?.map((a) => (
            <Button key={a.id} size="lg" variant="secondary" disabled={blocked} onClick={() => onAnswer({ kind: 'observation', answerId: a.id }, acknowledged)}>{a.label}</Button>
          ))}
        </div>
      )}
      {view.kind === 'task' && <Button size="lg" disabled={blocked} onClick={() => onAnswer({ kind: 'task' }, acknowledged)}>{view.confirmLabel ?? 'Done'}</Button>}
    </div>
  );
}

/** Where the preview ended: a Finding's cause, repair and parts, or a Hand-off's reason. */
export function PreviewEnding({ view, pictures }: { view: StepView; pictures?: readonly StepPicture[] | undefined }) {
  return (
    <div className="flex flex-col gap-2 rounded-lg border-2 border-go bg-go-soft p-3" data-testid="preview-ending">
      <p className="text-sm font-bold uppercase tracking-wide text-go">{view.kind === 'finding' ? 'Finding' : 'Hand-off'}</p>
      <h3 className="text-xl font-bold">{view.title}</h3>
      {view.cause && <p><strong>Cause:</strong> {view.cause}</p>}
      {view.repair && <p><strong>Repair:</strong> {view.repair}</p>}
      {view.parts && view.parts.length > 0 && <ul className="list-disc pl-5">{view.parts.map((p, i) => <li key={i}>{p.quantity} × {p.name}{p.partNumber ? ` (${p.partNumber})` : ''}</li>)}</ul>}
      {view.reason && <p><strong>Reason:</strong> {view.reason}</p>}
      <PreviewPictures pictures={pictures} />
    </div>
  );
}
