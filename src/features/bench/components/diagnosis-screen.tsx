import { useEffect, useMemo, useState } from 'react';
import { useParams } from 'react-router-dom';
import { pathFigures } from '@shared/engine/figures';
import { stepView } from '@shared/engine/step-view';
import type { ProcedureDocument } from '@shared/schema/procedure';
import { remeasuredAt, type PathStep } from '@shared/engine/walk';
import { Alert, Spinner } from '../../../components/ui/card';
import { LinkButton } from '../../../components/ui/button';
import type { LocalPhoto } from '../../../lib/offline/db';
import { useLocalDiagnosis } from '../hooks/use-local-diagnosis';
import { StepCard } from './step-card';
import { EndingForm } from './ending-form';
import { StepPictures } from './step-pictures';
import { PathList } from './path-list';
import { progressOf, type Progress } from './progress-line';
import { PhotoField } from './photo-field';
import { SyncBadge } from './sync-badge';
import { useFormat } from '../../../lib/format';

function useSecondsSince(since: number): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const t = setInterval(() => setNow(Date.now()), 1000);
    return () => clearInterval(t);
  }, []);
  return Math.max(0, Math.floor((now - since) / 1000));
}

function StepTimer({ since }: { since: number }) {
  const s = useSecondsSince(since);
  return <span className="tabular-nums" aria-label="Time on this step">{Math.floor(s / 60)}:{String(s % 60).padStart(2, '0')}</span>;
}

/**
 * Sync state, steps done, the estimate left (path figures) and the time on this step. The badge
 * gets the diagnosis id so a refusal of THIS diagnosis is said as such, ahead of any other.
 */
function ProgressHeader({ id, title, done, progress, since }: { id: string; title: string; done: number; progress: Progress; since: number | null }) {
  return (
    <header className="space-y-2">
      <p className="text-base text-ink-soft">{title}</p>
      <div className="flex flex-wrap items-center gap-3">
        <SyncBadge diagnosisId={id} />
        <span className="text-lg font-semibold" data-testid="progress">{done} done{progress.toGo ? ` · ${progress.toGo}` : ''}</span>
        {since !== null && <span className="ml-auto text-lg font-semibold">Time on step <StepTimer since={since} /></span>}
      </div>
      {progress.why && <p className="text-base font-semibold text-ink" data-testid="progress-why">{progress.why}</p>}
      <div className="h-3 overflow-hidden rounded-full bg-line" aria-hidden>
        <div className="h-full bg-signal" style={{ width: `${progress.percent}%` }} />
      </div>
    </header>
  );
}

/** A Formula is computed, not asked: its value shows above the step it led to. */
function ComputedCard({ doc, path }: { doc: ProcedureDocument; path: readonly PathStep[] }) {
  const last = [...path].reverse().find((p) => p.outcome !== 'ended');
  const step = last?.kind === 'formula' ? doc.steps.find((s) => s.id === last.stepId) : undefined;
  const fmt = useFormat();
  if (!step || step.kind !== 'formula' || last?.value === undefined) return null;
  return (
    <div className="rounded-lg border-2 border-notice bg-panel p-3" data-kind="formula" data-testid="computed">
      <p className="text-base font-bold uppercase tracking-wide text-notice">Computed, nothing to measure</p>
      <p className="text-xl font-bold">{step.title}: {fmt.reading({ value: last.value, quantity: step.quantity, significantDigits: 3 }, { unit: step.unit })}</p>
      <p className="text-base text-ink-soft">{step.instructions}</p>
    </div>
  );
}

/** The note and photos of a step, folded away until used (a gloved thumb opens it on purpose). */
function NoteAndPhotos({ note, setNote, photos, onAdd }: { note: string; setNote: (note: string) => void; photos: LocalPhoto[]; onAdd: (file: File) => Promise<void> }) {
  return (
    <details className="rounded-lg border-2 border-ink/30 bg-panel" open={note !== '' || photos.length > 0}>
      <summary className="flex min-h-12 cursor-pointer items-center gap-2 px-3 text-lg font-bold"><span aria-hidden className="text-2xl leading-none text-signal">+</span>Add a note or photo{photos.length ? ` (${photos.length} photo${photos.length > 1 ? 's' : ''})` : ''}</summary>
      <div className="space-y-3 p-3 pt-0">
        <label className="block text-lg font-bold">Note
          <textarea className="mt-1 w-full rounded-lg border-2 border-ink/40 bg-panel p-2 text-lg font-normal" rows={2} value={note} onChange={(e) => setNote(e.target.value)} />
        </label>
        <PhotoField photos={photos} onAdd={onAdd} />
      </div>
    </details>
  );
}

function EndedNotice({ id, finished }: { id: string; finished: boolean }) {
  return (
    <Alert tone="go" title={finished ? 'Diagnosis finished' : 'Handed off'}>
      <p>Everything is kept on this phone until it has synced.</p>
      <LinkButton to={`/bench/d/${id}/record`} size="lg" className="mt-3 w-full">Open the record and report</LinkButton>
    </Alert>
  );
}

/** The Bench step screen: one step at a time, walked on the phone, synced through the outbox. */
export function DiagnosisScreen() {
  const { id = '' } = useParams();
  const d = useLocalDiagnosis(id);
  const [editing, setEditing] = useState<number | null>(null);
  const figures = useMemo(() => (d.doc ? pathFigures(d.doc, { branchCounts: d.branchCounts }) : null), [d.doc, d.branchCounts]);
  const state = d.walked?.state;
  const stepKey = `${d.diagnosis?.rows.length ?? 0}-${editing ?? 'now'}`;
  const [shownAt, setShownAt] = useState(() => ({ key: stepKey, at: Date.now() }));
  if (shownAt.key !== stepKey) setShownAt({ key: stepKey, at: Date.now() });

  if (d.loading) return <Spinner label="Opening the diagnosis" />;
  if (d.error || !d.doc || !d.diagnosis || !state) return <Alert title="Cannot open this diagnosis">{d.error}</Alert>;
  const doc = d.doc;
  const editPath = editing === null ? null : state.path[editing];
  const currentView = editPath ? stepView(doc, doc.steps.find((s) => s.id === editPath.stepId)!) : state.current;
  const currentStep = currentView ? doc.steps.find((s) => s.id === currentView.id)! : null;
  const done = state.path.filter((p) => p.entryIndex !== null).length;
  const progress = figures ? progressOf(doc, figures.perStep, editing === null ? state.path : state.path.slice(0, editing), currentView?.id ?? null, done) : { toGo: null, why: null, percent: 0 };
  const startedAt = new Date(shownAt.at).toISOString();
  const photosHere = d.diagnosis.photos.filter((p) => p.stepId === (currentView?.id ?? state.ending?.id ?? null));

  return (
    <div className="mx-auto max-w-xl space-y-5 pb-16">
      <ProgressHeader id={id} title={`${d.diagnosis.procedureTitle} · ${d.diagnosis.vehicleLabel}`} done={done} progress={progress} since={currentView || state.ending ? shownAt.at : null} />

      {!editPath && <ComputedCard doc={doc} path={state.path} />}

      {editPath && <Alert tone="edge" title="Changing an earlier answer">The answers after it will be kept in the record as changed. <button type="button" className="underline min-h-12" onClick={() => setEditing(null)}>Keep the answer</button></Alert>}

      {currentView && currentStep && (
        <StepCard key={stepKey} view={currentView} step={currentStep} values={state.values} remeasure={!editPath && state.remeasure}
          remeasured={editPath ? 0 : remeasuredAt(state.path, currentView.id)}
          extras={(note, setNote) => <NoteAndPhotos note={note} setNote={setNote} photos={photosHere} onAdd={(f) => d.addPhoto(f, currentView.id)} />}
          onAnswer={(a) => { setEditing(null); return d.answer({ ...a, startedAt }, editing ?? undefined); }} />
      )}

      {!editPath && state.status === 'ended' && state.ending && d.diagnosis.status === 'active' && (
        <EndingForm view={state.ending} pictures={<StepPictures pictures={doc.steps.find((s) => s.id === state.ending!.id)?.pictures} />} onFinish={(outcome, note) => d.finish(state.ending!.id, outcome, note, startedAt)}
          photos={<PhotoField photos={photosHere} onAdd={(f) => d.addPhoto(f, state.ending!.id)} />} />
      )}
      {d.diagnosis.status !== 'active' && <EndedNotice id={id} finished={d.diagnosis.status === 'finished'} />}
      {state.status === 'stuck' && <Alert title="The procedure cannot go on from here">{state.problem?.message}</Alert>}

      <PathList doc={doc} path={state.path} closed={d.diagnosis.status !== 'active'} onChange={(i) => { setEditing(i); window.scrollTo(0, 0); }} />
    </div>
  );
}
