import { useState } from 'react';
import { useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import type { Quantity } from '@shared/measure/quantities';
import type { LocaleFormat } from '@shared/format/locale';
import { useFormat } from '../../../lib/format';
import { api, ApiError } from '../../../lib/api-client';
import { PageHeader, Alert, Spinner, Badge } from '../../../components/ui/card';
import { Button } from '../../../components/ui/button';
import { LimitsNotice } from '../../../components/ui/safety';
import { benchQueries } from '../api/queries';
import type { DiagnosisRecord, RecordStep, ReportResult } from '@shared/schema/bench';
import { SyncBadge } from './sync-badge';

const VERDICT: Record<string, [string, 'go' | 'stop' | 'edge']> = {
  within: ['within limits', 'go'], below: ['below limits', 'stop'], above: ['above limits', 'stop'],
  'borderline-low': ['borderline', 'edge'], 'borderline-high': ['borderline', 'edge'],
};

function parsed(s: RecordStep, fmt: LocaleFormat): string {
  if (s.value === null || !s.shown.quantity) return '';
  return fmt.reading({ value: s.value, quantity: s.shown.quantity as Quantity, significantDigits: 3 }, s.shown.unit ? { unit: s.shown.unit } : {});
}

function corrections(s: RecordStep, fmt: LocaleFormat): string {
  const c = s.shown.corrections ?? {};
  const out: string[] = [];
  if (s.shown.leadEntered) out.push(`test leads ${s.shown.leadEntered} subtracted`);
  if (c.temperatureFactor !== undefined) out.push(`corrected to 20 °C (×${fmt.fixed(c.temperatureFactor, 4)})`);
  return out.join('; ');
}

function answer(s: RecordStep, fmt: LocaleFormat): string {
  if (s.entered) return `${s.entered} → ${parsed(s, fmt)}`;
  if (s.answerId) return s.shown.answers?.find((a) => a.id === s.answerId)?.label ?? s.answerId;
  if (s.kind === 'formula') return `computed ${parsed(s, fmt)}`;
  if (s.kind === 'link') {
    const shown = s.shown as { procedure?: unknown; procedureTitle?: unknown };
    return `continued in ${String(shown.procedureTitle ?? shown.procedure ?? 'another procedure')}`;
  }
  return s.kind === 'task' ? 'done' : '';
}

const yesNo = (b: boolean) => (b ? 'yes' : 'no');

function TimelineStep({ s, attachments }: { s: RecordStep; attachments: DiagnosisRecord['attachments'] }) {
  const fmt = useFormat();
  const fixes = corrections(s, fmt);
  return (
    <li className={`rounded-lg border border-line p-3 break-inside-avoid ${s.superseded ? 'border-dashed bg-paper' : 'bg-panel'}`}>
      <div className="flex flex-wrap items-center gap-2">
        <span className="font-bold">{s.seq}. {s.shown.title ?? s.stepId}</span>
        {s.verdict && <Badge tone={VERDICT[s.verdict]?.[1] ?? 'edge'}>{VERDICT[s.verdict]?.[0]}</Badge>}
        {s.superseded && <Badge>changed later</Badge>}
        <span className="ml-auto text-sm text-ink-soft">{fmt.timeWithSeconds(s.answeredAt)}</span>
      </div>
      <p className="text-lg" data-testid="record-answer">{answer(s, fmt)}{s.shown.limitsText ? <span className="text-ink-soft"> · limits {fmt.decimals(s.shown.limitsText)}</span> : null}</p>
      {fixes && <p className="text-ink-soft">{fixes}</p>}
      {s.shown.acknowledged && <p className="font-semibold" data-testid="record-acknowledged">DANGER note acknowledged{s.shown.acknowledgedAt ? ` at ${fmt.time(s.shown.acknowledgedAt)}` : ''}</p>}
      {s.shown.cause && <p><strong>Cause:</strong> {s.shown.cause} <strong>Repair:</strong> {s.shown.repair}</p>}
      {s.note && <p className="text-ink-soft">Note: {s.note}</p>}
      {attachments.filter((a) => a.stepId === s.stepId && !s.superseded).map((a) => <img key={a.id} src={`/api/attachments/${a.id}/thumb`} alt={`Photo ${a.originalName}`} className="mt-2 inline-block h-24 w-24 rounded border border-line object-cover" />)}
    </li>
  );
}

function Outcome({ outcome }: { outcome: NonNullable<DiagnosisRecord['outcome']> }) {
  if ('reason' in outcome) {
    return <section className="rounded-lg border-2 border-ink/30 bg-panel p-3"><p><strong>Handed off:</strong> {outcome.reason}</p></section>;
  }
  return (
    <section className="rounded-lg border-2 border-ink/30 bg-panel p-3">
      {outcome.partsFitted && <p><strong>Parts fitted:</strong> {outcome.partsFitted.map((p) => `${p.name}${p.lot ? ` (lot ${p.lot})` : ''}`).join(', ') || 'none'}</p>}
      {outcome.finalCheck && <p><strong>Final check:</strong> spark {yesNo(outcome.finalCheck.spark)}, runs {yesNo(outcome.finalCheck.runs)}, stops {yesNo(outcome.finalCheck.stops)}</p>}
      {outcome.labourMinutes !== undefined && <p><strong>Labour:</strong> {outcome.labourMinutes} min</p>}
    </section>
  );
}

function CoachingNotes({ notes }: { notes: DiagnosisRecord['coachingNotes'] }) {
  return (
    <section aria-labelledby="coaching" className="space-y-2">
      <h2 id="coaching" className="text-xl font-bold">Coaching notes</h2>
      {notes.map((n) => <blockquote key={n.id} className="rounded-lg border-l-4 border-notice bg-panel p-3">{n.body}<footer className="text-sm text-ink-soft">— {n.authorName ?? 'Trainer'}{n.stepId ? ` on ${n.stepId}` : ''}</footer></blockquote>)}
    </section>
  );
}

/** The complete record as a printable timeline, with the e-mail report and coaching notes. */
export function RecordPage() {
  const { id = '' } = useParams();
  const fmt = useFormat();
  const record = useQuery(benchQueries.record(id));
  const [sent, setSent] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  if (record.isLoading) return <Spinner label="Loading the record" />;
  if (!record.data) return <Alert title="The record is not available">{record.error instanceof ApiError ? record.error.message : 'It shows once this phone has synced and has signal.'}</Alert>;
  const r = record.data;
  const email = async () => {
    setError(null);
    try { setSent((await api.post<ReportResult>(`/api/diagnoses/${id}/report`, {})).sentTo); } catch (e) { setError(e instanceof ApiError ? e.message : 'Not sent.'); }
  };
  return (
    <div className="mx-auto max-w-3xl space-y-4 pb-16">
      <PageHeader title={`${r.vehicleLabel} · ${r.procedureTitle}`} subtitle={`Version ${r.versionNumber} · ${r.technicianName} · started ${fmt.dateTime(r.startedAt)}`} actions={<span className="no-print"><SyncBadge /></span>} />
      <p className="text-lg"><strong>Complaint:</strong> {r.complaint}</p>
      <ol className="space-y-2" aria-label="Timeline">
        {r.steps.map((s) => <TimelineStep key={s.id} s={s} attachments={r.attachments} />)}
      </ol>
      {r.outcome && <Outcome outcome={r.outcome} />}
      {r.coachingNotes.length > 0 && <CoachingNotes notes={r.coachingNotes} />}
      <LimitsNotice />
      <div className="no-print grid gap-2 sm:grid-cols-2">
        <Button size="lg" className="min-h-14" onClick={() => window.print()}>Print</Button>
        <Button size="lg" variant="secondary" className="min-h-14" onClick={() => void email()}>E-mail to the service desk</Button>
      </div>
      {sent && <Alert tone="go" title="Report sent">Sent to {sent}.</Alert>}
      {error && <Alert title="Report not sent">{error}</Alert>}
    </div>
  );
}
