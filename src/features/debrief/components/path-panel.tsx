import { lazy, Suspense, useMemo } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import type { ProcedureDocument } from '@shared/schema';
import type { AnalyticsQuery } from '@shared/stats/debrief-schema';
import { Alert, Card, Spinner } from '../../../components/ui/card';
import { debriefQueries } from '../api/queries';
import { heatGraph } from '../lib/graph';
import { useDebriefFormat } from '../hooks/use-debrief-format';
import { FigureTableView } from './chart-card';
import { qs } from '../../../lib/api-client';

const ProcedureGraph = lazy(() => import('./procedure-graph'));

/** Where diagnoses go: reached/ended per step and the share of each branch, as a heat overlay. */
export function PathPanel({ q, doc }: { q: AnalyticsQuery; doc: ProcedureDocument }) {
  const { data, isLoading, error } = useQuery(debriefQueries.steps(q));
  const df = useDebriefFormat();
  const graph = useMemo(() => (data ? heatGraph(doc, data.steps, data.branches, data.diagnoses) : null), [data, doc]);
  if (isLoading) return <Spinner label="Counting diagnoses per step" />;
  if (error || !data || !graph) return <Alert title="The step figures could not be loaded">{(error as Error | null)?.message}</Alert>;
  const title = (id: string) => doc.steps.find((s) => s.id === id)?.title ?? id;
  const ended = (f: (typeof data.steps)[number]) => f.finished + f.handedOff + f.abandoned;
  const top = [...data.steps].sort((a, b) => ended(b) - ended(a))[0];
  const rows = doc.steps.map((s) => data.steps.find((f) => f.stepId === s.id) ?? { stepId: s.id, reached: 0, finished: 0, handedOff: 0, abandoned: 0, active: 0 })
    .sort((a, b) => b.reached - a.reached);
  return (
    <div className="flex flex-col gap-4">
      {top && ended(top) > 0 && (
        <Card className="border-l-4 border-l-signal">
          <p className="text-sm font-bold uppercase tracking-wide text-ink-soft">Most diagnoses ended at</p>
          <p className="text-2xl font-bold" data-testid="top-ending">{title(top.stepId)}</p>
          <p className="text-ink-soft">
            {df.count(ended(top))} of {df.count(data.diagnoses)} diagnoses ({df.percent(ended(top) / data.diagnoses)}):
            {' '}{top.finished} finished, {top.handedOff} handed off, {top.abandoned} abandoned.{' '}
            <Link className="font-semibold text-ink underline underline-offset-4" to={`/debrief${qs({ procedureId: q.procedureId, versionId: q.versionId, endingStepId: top.stepId, from: q.from, to: q.to })}`}>
              Open these diagnoses
            </Link>
          </p>
        </Card>
      )}
      <Suspense fallback={<Spinner label="Drawing the procedure" />}>
        <ProcedureGraph doc={doc} graph={graph} label="Procedure graph: the darker a step or branch, the more diagnoses took it" />
      </Suspense>
      <p className="text-sm text-ink-soft">Darker steps were reached by more of the {df.count(data.diagnoses)} diagnoses; each branch shows the share of answers that took it. Drag the graph to follow the procedure down; the table below holds the same figures.</p>
      <FigureTableView caption="Reached and ended per step" table={{
        header: ['Step', 'Reached', 'Finished here', 'Handed off here', 'Abandoned here'],
        rows: rows.map((f) => [title(f.stepId), f.reached, f.finished, f.handedOff, f.abandoned]),
      }} />
    </div>
  );
}
