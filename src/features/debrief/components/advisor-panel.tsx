import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import type { ProcedureDocument } from '@shared/schema';
import type { AdvisorChain, AnalyticsQuery } from '@shared/stats/debrief-schema';
import { Alert, Badge, Card, EmptyState, Spinner } from '../../../components/ui/card';
import { Button } from '../../../components/ui/button';
import { ApiError } from '../../../lib/api-client';
import { useSession } from '../../../lib/session';
import { debriefQueries } from '../api/queries';
import { useDraftFromAdvice } from '../api/mutations';
import { formatDuration } from '../lib/format';
import { useDebriefFormat } from '../hooks/use-debrief-format';
import { adviceSummary, byTimeToWin } from '../lib/advice';
import { FigureTableView } from './chart-card';

function ChainCard({ chain, doc, versionId, canDraft }: { chain: AdvisorChain; doc: ProcedureDocument; versionId: string; canDraft: boolean }) {
  const draft = useDraftFromAdvice();
  const df = useDebriefFormat();
  const title = (id: string) => doc.steps.find((s) => s.id === id)?.title ?? id;
  const saving = chain.currentSeconds - chain.proposedSeconds;
  const rows = (list: AdvisorChain['current']) => list.map((c, i) => [i + 1, title(c.stepId), df.percent(c.revealShare, 1), formatDuration(c.seconds) + (c.secondsFrom === 'estimate' ? ' (estimate)' : ''),
    c.seconds > 0 ? df.fixed(c.revealShare / (c.seconds / 60), 3) : '–']);
  const header = ['#', 'Check', 'Reveals the fault', 'Median time', 'Chance per minute'];
  const err = draft.error instanceof ApiError ? draft.error : null;
  return (
    <Card className="flex flex-col gap-3">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="text-lg">Chain of {chain.checks.length} checks, entered by {df.count(chain.entered)} diagnoses</h3>
        {chain.changes ? <Badge tone="signal">Saves {formatDuration(saving)} per diagnosis on average</Badge> : <Badge tone="go">Already in the best order</Badge>}
      </div>
      <p className="text-ink-soft">
        Expected time through these checks: now {formatDuration(chain.currentSeconds)}, in the proposed order {formatDuration(chain.proposedSeconds)}.
      </p>
      <div className="grid gap-4 lg:grid-cols-2">
        <div><h4 className="mb-1 font-semibold">Current order</h4><FigureTableView caption="Current order" table={{ header, rows: rows(chain.current) }} /></div>
        <div><h4 className="mb-1 font-semibold">Proposed order</h4><FigureTableView caption="Proposed order" table={{ header, rows: rows(chain.proposed) }} /></div>
      </div>
      {canDraft && chain.changes && (
        <div className="flex flex-wrap items-center gap-3">
          <Button busy={draft.isPending} disabled={draft.isSuccess} onClick={() => draft.mutate({ versionId, order: chain.proposed.map((c) => c.stepId) })}>
            Make a draft in this order
          </Button>
          {draft.isSuccess && <p role="status" className="text-go">Draft created from v{draft.data.basedOnNumber}. <Link className="underline" to={`/drafting/${draft.data.procedureId}`}>Open it in Drafting</Link></p>}
          {err && <p role="alert" className="font-semibold text-stop">{err.message}</p>}
        </div>
      )}
    </Card>
  );
}

/** The check-order advisor: independent checks ordered by chance of revealing the fault per minute. */
export function AdvisorPanel({ q, doc, versionId }: { q: AnalyticsQuery; doc: ProcedureDocument; versionId: string }) {
  const session = useSession();
  const { data, isLoading, error } = useQuery(debriefQueries.advisor({ ...q, versionId }));
  if (isLoading) return <Spinner label="Estimating the checks" />;
  if (error || !data) return <Alert title="The advisor could not run">{(error as Error | null)?.message}</Alert>;
  return (
    <div className="flex flex-col gap-4">
      <p className="max-w-3xl text-ink-soft">
        A chain is a run of Reading or Observation steps where each either reveals the fault (leads to a Finding) or passes to the next.
        For independent checks, testing in decreasing order of the chance of revealing the fault per minute gives the least expected time
        (Kadane &amp; Simon 1977; Heckerman, Breese &amp; Rommelse 1995). Chances and times come from the recorded diagnoses of this version.
      </p>
      {data.chains.length === 0 && <EmptyState title="This version has no chain of independent checks to reorder" />}
      {data.chains.length > 0 && <p className="text-lg font-semibold">{adviceSummary(data.chains, formatDuration)}</p>}
      {byTimeToWin(data.chains).map((c) => <ChainCard key={c.checks.join()} chain={c} doc={doc} versionId={data.versionId} canDraft={session.may('advice.draft')} />)}
    </div>
  );
}
