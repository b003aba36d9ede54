import { lazy, Suspense, useMemo, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Badge, Card, PageHeader, Spinner } from '../../../components/ui/card';
import { debriefQueries } from '../api/queries';
import { pathGraph } from '../lib/graph';
import { formatDuration, STATUS_LABEL, STATUS_TONE } from '../lib/format';
import { useDebriefFormat } from '../hooks/use-debrief-format';
import { ReplayTimeline, NoteLine } from './replay-timeline';
import { CoachingForm } from './coaching-form';

const ProcedureGraph = lazy(() => import('./procedure-graph'));

/** One diagnosis replayed: the timeline beside the procedure graph with the path drawn on it. */
export function ReplayPage() {
  const { id = '' } = useParams();
  const { data, isLoading, error } = useQuery(debriefQueries.diagnosis(id));
  const df = useDebriefFormat();
  const [selected, setSelected] = useState<string | null>(null);
  const graph = useMemo(() => (data ? pathGraph(data.document, data.path, selected) : null), [data, selected]);
  if (isLoading) return <Spinner label="Loading the diagnosis" />;
  if (error || !data) return <Alert title="This diagnosis could not be opened">{(error as Error | null)?.message}</Alert>;
  const d = data.diagnosis;
  const stepChoices = [...new Set(data.path)].map((id) => ({ id, title: data.document.steps.find((x) => x.id === id)?.title ?? id }));
  return (
    <>
      <p className="mb-2"><Link to="/debrief" className="text-ink-soft underline underline-offset-4 hover:text-ink">← All diagnoses</Link></p>
      <PageHeader title={`${d.vehicleLabel}: ${d.procedureTitle}`}
        subtitle={<span>{d.vehicleModel} · v{d.versionNumber} · {d.technicianName} · started {df.dateTime(d.startedAt)} · {formatDuration(d.durationSeconds)}</span>}
        actions={<Badge tone={STATUS_TONE[d.status]}>{STATUS_LABEL[d.status]}</Badge>} />
      <div className="mb-4 flex flex-wrap gap-2">
        {d.flags.borderline && <Badge tone="edge">Borderline verdict on the way</Badge>}
        {d.flags.takenBack && <Badge tone="neutral">A step was taken back</Badge>}
        {d.flags.comeback && <Badge tone="stop">Vehicle came back within the comeback window</Badge>}
        {d.complaint && <span className="text-ink-soft">Complaint: {d.complaint}</span>}
      </div>
      <div className="grid gap-4 xl:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
        <section aria-labelledby="timeline-h" className="flex flex-col gap-3">
          <h2 id="timeline-h" className="text-xl">Timeline</h2>
          <ReplayTimeline replay={data} selected={selected} onSelect={setSelected} />
        </section>
        <section aria-labelledby="graph-h" className="flex flex-col gap-3">
          <h2 id="graph-h" className="text-xl">Path through the procedure</h2>
          <Suspense fallback={<Spinner label="Drawing the procedure" />}>
            {graph && <ProcedureGraph doc={data.document} graph={graph} label="Procedure graph with the path taken" onSelect={setSelected} focus={data.path} />}
          </Suspense>
          <Card>
            <h2 className="mb-2 text-xl">Coaching</h2>
            {data.notes.filter((n) => n.stepId === null).map((n) => <NoteLine key={n.id} note={n} />)}
            <div className="mt-3"><CoachingForm diagnosisId={d.id} steps={stepChoices} stepId={selected} onStep={setSelected} /></div>
          </Card>
        </section>
      </div>
    </>
  );
}
