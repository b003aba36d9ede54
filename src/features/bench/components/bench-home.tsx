import { useEffect, useMemo, useState, useSyncExternalStore } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { listLocalDiagnoses, type LocalDiagnosis } from '../../../lib/offline/db';
import { syncStore } from '../../../lib/offline/outbox';
import { PageHeader, Badge } from '../../../components/ui/card';
import { LinkButton } from '../../../components/ui/button';
import { LimitsNotice } from '../../../components/ui/safety';
import { benchQueries } from '../api/queries';
import type { DiagnosisSummary } from '@shared/schema/bench';
import { SyncBadge } from './sync-badge';
import { resumeFromServer } from '../lib/resume';
import { useFormat } from '../../../lib/format';

/** How many ended diagnoses the list shows at first, and adds per "show more". */
const PAGE = 10;

const STATUS: Record<string, { label: string; tone: 'go' | 'signal' | 'edge' | 'neutral' }> = {
  active: { label: 'In progress', tone: 'signal' }, finished: { label: 'Finished', tone: 'go' },
  handed_off: { label: 'Handed off', tone: 'edge' }, abandoned: { label: 'Abandoned', tone: 'neutral' },
};

function DiagnosisLink({ d }: { d: DiagnosisSummary }) {
  const fmt = useFormat();
  return (
    <Link to={`/bench/d/${d.id}/record`} className="flex min-h-14 items-center justify-between gap-2 rounded-lg border border-line bg-panel p-3">
      <span><strong>{d.vehicleLabel}</strong> · {d.procedureTitle}<span className="block text-ink-soft">{fmt.date(d.startedAt)} · {d.stepsAnswered} {d.stepsAnswered === 1 ? 'step' : 'steps'}</span></span>
      <Badge tone={STATUS[d.status]?.tone ?? 'neutral'}>{STATUS[d.status]?.label ?? d.status}</Badge>
    </Link>
  );
}

/** Diagnoses in progress on this phone, each one tap from its current step. */
function ResumeList({ diagnoses }: { diagnoses: LocalDiagnosis[] }) {
  const fmt = useFormat();
  return (
    <section aria-labelledby="resume" className="space-y-2">
      <h2 id="resume" className="text-xl font-bold">Resume on this phone</h2>
      {diagnoses.length === 0 && <p className="text-ink-soft">Nothing in progress on this phone.</p>}
      {diagnoses.map((d) => (
        <Link key={d.id} to={`/bench/d/${d.id}`} className="flex min-h-16 items-center justify-between gap-2 rounded-lg border-2 border-signal bg-panel p-3 text-lg font-semibold">
          <span>{d.vehicleLabel} · {d.procedureTitle}<span className="block text-base font-normal text-ink-soft">{d.rows.length} {d.rows.length === 1 ? 'answer' : 'answers'} · started {fmt.sameDayTime(d.startedAt)}</span></span>
          <span aria-hidden>›</span>
        </Link>
      ))}
    </section>
  );
}

/** One diagnosis on another phone: who, when it was last answered, and the step it waits at. */
function ElsewhereCard({ d }: { d: DiagnosisSummary }) {
  const fmt = useFormat();
  return (
    <Link to={`/bench/d/${d.id}/record`} className="block min-h-14 rounded-lg border border-line bg-panel p-3">
      <strong>{d.vehicleLabel}</strong> · {d.procedureTitle}
      <span className="block">Waiting at: <strong>{d.currentStepTitle ?? 'its ending'}</strong></span>
      <span className="block text-ink-soft">
        {d.technicianName} · started {fmt.sameDayTime(d.startedAt)} · last answer {fmt.sameDayTime(d.lastActivityAt)} · {d.stepsAnswered} {d.stepsAnswered === 1 ? 'step' : 'steps'}
      </span>
    </Link>
  );
}

/** My diagnoses in progress on another phone: brought onto this one with what the server holds. */
function ElsewhereList({ diagnoses }: { diagnoses: DiagnosisSummary[] }) {
  const navigate = useNavigate();
  const [problem, setProblem] = useState<string | null>(null);
  const resume = async (id: string) => {
    try {
      await resumeFromServer(id);
      navigate(`/bench/d/${id}`);
    } catch {
      setProblem('This diagnosis could not be brought onto this phone. Try again with signal.');
    }
  };
  if (diagnoses.length === 0) return null;
  return (
    <section aria-labelledby="elsewhere" className="space-y-2">
      <h2 id="elsewhere" className="text-xl font-bold">In progress on another phone</h2>
      {problem && <p role="alert" className="text-stop">{problem}</p>}
      <ul className="space-y-2">
        {diagnoses.map((d) => (
          <li key={d.id} className="space-y-1">
            <ElsewhereCard d={d} />
            <button type="button" onClick={() => void resume(d.id)} className="min-h-12 w-full rounded-lg border-2 border-signal bg-panel px-3 text-lg font-semibold">
              Continue {d.vehicleLabel} on this phone
            </button>
          </li>
        ))}
      </ul>
    </section>
  );
}

/** Ended diagnoses, newest first, ten at a time. */
function RecentList({ ended, loaded, failed }: { ended: DiagnosisSummary[]; loaded: boolean; failed: boolean }) {
  const [shown, setShown] = useState(PAGE);
  return (
    <section aria-labelledby="history" className="space-y-2">
      <h2 id="history" className="text-xl font-bold">My recent diagnoses</h2>
      {failed && <p className="text-ink-soft">History needs a connection; it will show when the signal is back.</p>}
      {loaded && ended.length === 0 && <p className="text-ink-soft">None yet.</p>}
      <ul className="space-y-2">
        {ended.slice(0, shown).map((d) => <li key={d.id}><DiagnosisLink d={d} /></li>)}
      </ul>
      {ended.length > shown && (
        <button type="button" onClick={() => setShown(shown + PAGE)} className="min-h-12 w-full rounded-lg border border-line bg-panel px-3 text-lg font-semibold">
          Show {Math.min(PAGE, ended.length - shown)} more ({ended.length - shown} older)
        </button>
      )}
    </section>
  );
}

/**
 * This phone's diagnoses: all of them, and those to resume (in progress and not set aside: the
 * sync badge lists set-aside ones, with their download).
 */
function useDiagnosesOnPhone(): { all: LocalDiagnosis[]; resumable: LocalDiagnosis[] } {
  const [local, setLocal] = useState<LocalDiagnosis[]>([]);
  const { aside } = useSyncExternalStore(syncStore.subscribe, syncStore.get);
  // The sync status is published anew after every message: only a change in which diagnoses are
  // set aside (one removed leaves the phone) calls for reading the phone's list again.
  const asideIds = aside.map((a) => a.diagnosisId).join(' ');
  useEffect(() => { void listLocalDiagnoses().then(setLocal); }, [asideIds]);
  return useMemo(() => {
    const setAside = new Set(asideIds.split(' '));
    return { all: local, resumable: local.filter((d) => d.status === 'active' && !setAside.has(d.id)) };
  }, [local, asideIds]);
}

/** Bench home: resume active diagnoses (from this phone and the server), start one, see history. */
export function BenchHome() {
  const server = useQuery(benchQueries.diagnoses());
  const local = useDiagnosesOnPhone();
  const onPhone = new Set(local.all.map((d) => d.id));
  const history = (server.data ?? []).filter((d) => !(d.status === 'active' && onPhone.has(d.id)));
  return (
    <div className="mx-auto max-w-xl space-y-5 pb-16">
      <PageHeader title="Bench" actions={<SyncBadge />} />
      <LinkButton to="/bench/start" size="lg" className="min-h-16 w-full text-xl">Start a diagnosis</LinkButton>
      <ResumeList diagnoses={local.resumable} />
      <ElsewhereList diagnoses={history.filter((d) => d.status === 'active')} />
      <RecentList ended={history.filter((d) => d.status !== 'active')} loaded={Boolean(server.data)} failed={server.isError} />
      <LinkButton to="/bench/job-card" variant="secondary" className="min-h-12 w-full">Print a job card</LinkButton>
      <LimitsNotice />
    </div>
  );
}
