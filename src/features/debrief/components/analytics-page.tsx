import { useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import type { AnalyticsQuery } from '@shared/stats/debrief-schema';
import { Alert, Card, EmptyState, PageHeader, Spinner } from '../../../components/ui/card';
import { cx } from '../../../components/ui/cx';
import { debriefQueries } from '../api/queries';
import { AnalyticsFilters, type AnalyticsSelection } from './analytics-filters';
import { PathPanel } from './path-panel';
import { FindingsPanel } from './findings-panel';
import { ReadingsPanel } from './readings-panel';
import { TimesPanel } from './times-panel';
import { AdvisorPanel } from './advisor-panel';

const TABS = [
  { id: 'path', label: 'Where diagnoses go' },
  { id: 'findings', label: 'Findings' },
  { id: 'readings', label: 'Readings' },
  { id: 'time', label: 'Time' },
  { id: 'advisor', label: 'Check order' },
] as const;

/** Procedure analytics over a date range, for one version or all versions. */
export function AnalyticsPage() {
  const [params, setParams] = useSearchParams();
  const procedures = useQuery(debriefQueries.procedures());
  if (procedures.isLoading) return <Spinner label="Loading procedures" />;
  if (procedures.error) return <Alert title="Procedures could not be loaded">{procedures.error.message}</Alert>;
  const list = procedures.data ?? [];
  if (!list.length) return <EmptyState title="No published procedure yet">Analytics appear once a procedure is published and diagnosed.</EmptyState>;
  const procedure = list.find((p) => p.id === params.get('procedureId')) ?? list.find((p) => /no spark/i.test(p.title)) ?? list[0]!;
  const sel: AnalyticsSelection = {
    procedureId: procedure.id, versionId: params.get('versionId') ?? undefined, from: params.get('from') ?? undefined, to: params.get('to') ?? undefined,
  };
  const tab = TABS.find((t) => t.id === params.get('tab'))?.id ?? 'path';
  const set = (patch: Record<string, string | undefined>) => {
    const next = new URLSearchParams(params);
    for (const [k, v] of Object.entries(patch)) if (v) next.set(k, v); else next.delete(k);
    setParams(next, { replace: true });
  };
  const q: AnalyticsQuery = { procedureId: sel.procedureId, ...(sel.versionId ? { versionId: sel.versionId } : {}), ...(sel.from ? { from: sel.from } : {}), ...(sel.to ? { to: sel.to } : {}) };
  const version = procedure.versions.find((v) => v.id === sel.versionId) ?? procedure.versions[0]!;
  return (
    <>
      <PageHeader title={`Analytics: ${procedure.title}`} subtitle={sel.versionId ? `Version ${version.number}` : 'All versions (the graph shows the latest)'} />
      <Card className="mb-4"><AnalyticsFilters procedures={list} value={sel} onChange={(v) => set({ procedureId: v.procedureId, versionId: v.versionId, from: v.from, to: v.to })} /></Card>
      <div role="tablist" aria-label="Analytics views" className="mb-4 flex flex-wrap gap-1 border-b-2 border-line">
        {TABS.map((t) => (
          <button key={t.id} role="tab" type="button" aria-selected={tab === t.id} onClick={() => set({ tab: t.id })}
            className={cx('-mb-0.5 min-h-11 border-b-4 px-4 font-semibold', tab === t.id ? 'border-signal text-ink' : 'border-transparent text-ink-soft hover:text-ink')}>
            {t.label}
          </button>
        ))}
      </div>
      <div role="tabpanel" aria-label={TABS.find((t) => t.id === tab)!.label}>
        {tab === 'path' && <PathPanel q={q} doc={procedure.document} />}
        {tab === 'findings' && <FindingsPanel q={q} doc={procedure.document} />}
        {tab === 'readings' && <ReadingsPanel q={q} doc={procedure.document} />}
        {tab === 'time' && <TimesPanel q={q} doc={procedure.document} />}
        {tab === 'advisor' && <AdvisorPanel q={q} doc={procedure.document} versionId={version.id} />}
      </div>
    </>
  );
}
