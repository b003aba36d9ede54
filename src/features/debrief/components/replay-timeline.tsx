import { Badge } from '../../../components/ui/card';
import { cx } from '../../../components/ui/cx';
import type { ProcedureDocument } from '@shared/schema';
import type { CoachingNote, Replay, ReplayStep } from '../api/types';
import { formatDuration, type DebriefFormat } from '../lib/format';
import { useDebriefFormat } from '../hooks/use-debrief-format';
import { useFormat } from '../../../lib/format';

const VERDICT: Record<string, { label: string; tone: 'go' | 'stop' | 'edge' }> = {
  within: { label: 'Within limits', tone: 'go' },
  below: { label: 'Below limits', tone: 'stop' },
  above: { label: 'Above limits', tone: 'stop' },
  'borderline-low': { label: 'Borderline low', tone: 'edge' },
  'borderline-high': { label: 'Borderline high', tone: 'edge' },
};

function answerLabel(doc: ProcedureDocument, s: ReplayStep): string | null {
  const step = doc.steps.find((x) => x.id === s.stepId);
  if (!step) return null;
  if (step.kind === 'observation') return step.answers.find((a) => a.id === s.answerId)?.label ?? s.answerId;
  if ((step.kind === 'reading' || step.kind === 'formula') && s.bandId) {
    return s.bandId === 'borderline' ? 'Borderline branch' : step.bands.find((b) => b.id === s.bandId)?.label ?? s.bandId;
  }
  return step.kind === 'task' ? step.confirmLabel : null;
}

/** "value ± U" as the interval the verdict used (meter uncertainty), when the step recorded one. */
function intervalText(s: ReplayStep, df: DebriefFormat): string | null {
  const i = s.shown.interval;
  if (!i) return null;
  const q = s.shown.quantity ?? null;
  const unit = s.shown.unit ?? null;
  return `${df.value(i.low, q, unit)} to ${df.value(i.high, q, unit)}`;
}

/** The steps in the order they were answered, superseded answers struck through, with notes. */
export function ReplayTimeline({ replay, selected, onSelect }: { replay: Replay; selected: string | null; onSelect: (id: string) => void }) {
  const notesOn = (id: string | null): CoachingNote[] => replay.notes.filter((n) => n.stepId === id);
  const df = useDebriefFormat();
  const fmt = useFormat();
  return (
    <ol className="flex flex-col gap-2" aria-label="Timeline of steps">
      {replay.steps.map((s) => {
        const title = s.shown.title ?? replay.document.steps.find((x) => x.id === s.stepId)?.title ?? s.stepId;
        const verdict = s.verdict ? VERDICT[s.verdict] : undefined;
        const answer = answerLabel(replay.document, s);
        const photos = replay.photos.filter((p) => p.stepId === s.stepId);
        return (
          <li key={s.id} className={cx('rounded-lg border p-3', s.stepId === selected ? 'border-edge ring-2 ring-edge/40' : 'border-line', s.superseded ? 'border-dashed bg-paper' : 'bg-panel')}>
            <button type="button" className="flex w-full flex-wrap items-baseline justify-between gap-2 text-left" onClick={() => onSelect(s.stepId)}>
              <span className={cx('font-semibold', s.superseded && 'line-through')}>{s.seq}. {title}</span>
              <span className="text-sm tabular-nums text-ink-soft">{formatDuration(s.seconds)}</span>
            </button>
            <div className="mt-1 flex flex-wrap items-center gap-2 text-sm">
              {s.entered && <span>Entered <strong className="tabular-nums">{s.entered}</strong></span>}
              {verdict && <Badge tone={verdict.tone}>{verdict.label}</Badge>}
              {answer && <span className="text-ink-soft">→ {answer}</span>}
              {s.superseded && <Badge tone="neutral">Taken back, answered again</Badge>}
              {s.shown.limitsText && <span className="text-ink-soft">Limits shown: {fmt.decimals(s.shown.limitsText)}</span>}
              {intervalText(s, df) && <span className="text-ink-soft">Interval with the meter's uncertainty: {intervalText(s, df)}</span>}
              {s.shown.leadEntered && <span className="text-ink-soft">Test leads nulled at {s.shown.leadEntered}</span>}
            </div>
            {s.shown.question && <p className="mt-1 text-sm text-ink-soft">Asked: {s.shown.question}</p>}
            {s.note && <p className="mt-1 text-sm">Technician's note: {s.note}</p>}
            {photos.length > 0 && (
              <div className="mt-2 flex flex-wrap gap-2">
                {photos.map((p) => (
                  <a key={p.id} href={`/api/attachments/${p.id}`} target="_blank" rel="noreferrer">
                    <img src={`/api/attachments/${p.id}/thumb`} alt={`Photo at ${title}`} className="h-20 w-20 rounded border border-line object-cover" />
                  </a>
                ))}
              </div>
            )}
            {!s.superseded && notesOn(s.stepId).map((n) => <NoteLine key={n.id} note={n} />)}
          </li>
        );
      })}
      {replay.diagnosis.endingTitle && (
        <li className="rounded-lg border-2 border-ink/70 bg-paper p-3">
          <p className="font-semibold">Ended: {replay.diagnosis.endingTitle}</p>
          <p className="text-sm text-ink-soft">{df.dateTime(replay.diagnosis.endedAt)}</p>
        </li>
      )}
    </ol>
  );
}

export function NoteLine({ note }: { note: CoachingNote }) {
  const df = useDebriefFormat();
  return (
    <blockquote className="mt-2 border-l-4 border-signal bg-signal-soft/60 px-3 py-2 text-sm">
      <p>{note.body}</p>
      <footer className="text-ink-soft">{note.authorName}, {df.dateTime(note.createdAt)}</footer>
    </blockquote>
  );
}
