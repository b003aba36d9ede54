import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import {
  useTable, tableFeatures, rowSortingFeature, rowPaginationFeature, type ColumnDef, type SortingState, type PaginationState,
} from '@tanstack/react-table';
import type { DiagnosisListQuery, DiagnosisRow } from '@shared/stats/debrief-schema';
import { Badge, Card, PageHeader, Spinner, Alert } from '../../../components/ui/card';
import { Button, buttonClass } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { SortingHead, StripedBody } from '../../../components/ui/data-table';
import { debriefQueries, diagnosesCsvUrl } from '../api/queries';
import { useDiagnosisFilters } from '../hooks/use-diagnosis-filters';
import { DiagnosisFilters } from './diagnosis-filters';
import { formatDuration, STATUS_LABEL, STATUS_TONE } from '../lib/format';
import { useDebriefFormat } from '../hooks/use-debrief-format';

/** The start of a diagnosis in the shop's locale, linking to its replay. */
function StartedLink({ row }: { row: DiagnosisRow }) {
  const df = useDebriefFormat();
  return <Link className="font-semibold text-ink underline underline-offset-4 hover:text-signal" to={`diagnoses/${row.id}`}>{df.dateTime(row.startedAt)}</Link>;
}

const features = tableFeatures({ rowSortingFeature, rowPaginationFeature });
type Columns = ColumnDef<typeof features, DiagnosisRow>[];

const columns: Columns = [
  { id: 'startedAt', header: 'Started', accessorFn: (r) => r.startedAt,
    cell: ({ row }) => <StartedLink row={row.original} /> },
  { id: 'procedure', header: 'Procedure', accessorFn: (r) => r.procedureTitle,
    cell: ({ row }) => <span>{row.original.procedureTitle} <span className="text-ink-soft">v{row.original.versionNumber}</span></span> },
  { id: 'vehicle', header: 'Vehicle', accessorFn: (r) => r.vehicleLabel,
    cell: ({ row }) => <span title={row.original.vehicleModel}>{row.original.vehicleLabel}</span> },
  { id: 'technician', header: 'Technician', accessorFn: (r) => r.technicianName },
  { id: 'status', header: 'Status', accessorFn: (r) => r.status,
    cell: ({ row }) => <Badge tone={STATUS_TONE[row.original.status]}>{STATUS_LABEL[row.original.status]}</Badge> },
  { id: 'ending', header: 'Ended at', enableSorting: false, accessorFn: (r) => r.endingTitle ?? '',
    cell: ({ row }) => <span>{row.original.endingTitle ?? '–'}</span> },
  { id: 'duration', header: 'Duration', accessorFn: (r) => r.durationSeconds,
    cell: ({ row }) => <span className="tabular-nums">{formatDuration(row.original.durationSeconds)}</span> },
  { id: 'flags', header: 'Flags', enableSorting: false, accessorFn: () => '', cell: ({ row }) => <Flags row={row.original} /> },
];

function Flags({ row }: { row: DiagnosisRow }) {
  const { borderline, takenBack, comeback } = row.flags;
  if (!borderline && !takenBack && !comeback) return <span className="text-ink-soft">–</span>;
  return (
    <span className="flex flex-wrap gap-1">
      {borderline && <Badge tone="edge">Borderline</Badge>}
      {takenBack && <Badge tone="neutral">Taken back</Badge>}
      {comeback && <Badge tone="stop">Came back</Badge>}
    </span>
  );
}

type PageQuery = Partial<DiagnosisListQuery> & { page: number; pageSize: number };
type Update = ReturnType<typeof useDiagnosisFilters>[1];

/** Sorting and paging are the server's: the table only turns header clicks and page buttons into URL changes. */
function useDiagnosisTable(query: PageQuery, rows: DiagnosisRow[], total: number, update: Update) {
  const sorting: SortingState = [{ id: query.sort ?? 'startedAt', desc: (query.dir ?? 'desc') === 'desc' }];
  const pagination: PaginationState = { pageIndex: query.page - 1, pageSize: query.pageSize };
  return useTable({
    features, columns, data: rows, manualSorting: true, manualPagination: true, rowCount: total,
    state: { sorting, pagination },
    onSortingChange: (u) => {
      const next = typeof u === 'function' ? u(sorting) : u;
      const s = next[0] ?? { id: 'startedAt', desc: true };
      update({ sort: s.id as DiagnosisListQuery['sort'], dir: s.desc ? 'desc' : 'asc' });
    },
    onPaginationChange: (u) => {
      const next = typeof u === 'function' ? u(pagination) : u;
      update({ page: next.pageIndex + 1, pageSize: next.pageSize });
    },
  });
}

type DiagnosisTable = ReturnType<typeof useDiagnosisTable>;

function DiagnosisTableView({ table, total, fetching }: { table: DiagnosisTable; total: number; fetching: boolean }) {
  return (
    <div className={cx('overflow-x-auto rounded-[var(--radius-card)] border border-line bg-panel', fetching && 'opacity-70')}>
      <table className="w-full text-left">
        <caption className="sr-only">Diagnoses, {total} in this selection</caption>
        <SortingHead groups={table.getHeaderGroups()} buttonClassName="inline-flex min-h-8 items-center gap-1 uppercase tracking-wide hover:text-ink"
          render={(h) => <table.FlexRender header={h} />} />
        <StripedBody table={table} columnCount={columns.length} empty="No diagnoses match these filters." emptyClassName="px-3 py-8 text-center text-ink-soft" />
      </table>
    </div>
  );
}

function Pager({ table, total, page, pages }: { table: DiagnosisTable; total: number | undefined; page: number; pages: number }) {
  const df = useDebriefFormat();
  return (
    <nav className="mt-3 flex flex-wrap items-center justify-between gap-2" aria-label="Pages">
      <p className="text-ink-soft">{total !== undefined ? `${df.count(total)} diagnoses · page ${page} of ${pages}` : ''}</p>
      <div className="flex gap-2">
        <Button variant="secondary" disabled={page <= 1} onClick={() => table.previousPage()}>Previous</Button>
        <Button variant="secondary" disabled={page >= pages} onClick={() => table.nextPage()}>Next</Button>
      </div>
    </nav>
  );
}

/** Every diagnosis of the shop: filtered, sorted and paged on the server. */
export function DiagnosesPage() {
  const [q, update] = useDiagnosisFilters();
  const query = { ...q, page: q.page ?? 1, pageSize: q.pageSize ?? 25 };
  const { data, isLoading, error, isFetching } = useQuery(debriefQueries.diagnoses(query));
  const rows = useMemo(() => data?.rows ?? [], [data]);
  const table = useDiagnosisTable(query, rows, data?.total ?? 0, update);
  const procedures = useQuery(debriefQueries.procedures());
  const endingTitle = (id: string) =>
    procedures.data?.flatMap((p) => p.document.steps).find((st) => st.id === id)?.title ?? rows.find((r) => r.endingStepId === id)?.endingTitle ?? id;
  const pages = Math.max(1, Math.ceil((data?.total ?? 0) / query.pageSize));
  return (
    <>
      <PageHeader title="Diagnoses" subtitle="Every diagnosis of the shop. Open one to replay it and leave a coaching note."
        actions={<a className={buttonClass('secondary')} href={diagnosesCsvUrl(query)} download>Export CSV</a>} />
      <Card className="mb-4"><DiagnosisFilters q={query} onChange={update} /></Card>
      {query.endingStepId && (
        <p className="mb-3 flex flex-wrap items-center gap-2">
          <Badge tone="signal">Only diagnoses that ended at “{endingTitle(query.endingStepId)}”</Badge>
          <Button variant="ghost" onClick={() => update({ endingStepId: undefined })}>Show all endings</Button>
        </p>
      )}
      {error && <Alert title="The diagnoses could not be loaded">{(error as Error).message}</Alert>}
      {isLoading ? <Spinner label="Loading diagnoses" /> : <DiagnosisTableView table={table} total={data?.total ?? 0} fetching={isFetching} />}
      <Pager table={table} total={data?.total} page={query.page} pages={pages} />
    </>
  );
}
