import { useState, type ReactNode } from 'react';
import {
  useTable, tableFeatures, rowSortingFeature, globalFilteringFeature, columnFilteringFeature,
  createSortedRowModel, createFilteredRowModel, sortFns, filterFns, type ColumnDef, type ReactTable, type RowData, type TableFeatures,
} from '@tanstack/react-table';
import { Input } from './field';
import { cx } from './cx';

export const tableFeatureSet = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  globalFilteringFeature,
  sortedRowModel: createSortedRowModel(),
  filteredRowModel: createFilteredRowModel(),
  sortFns,
  filterFns,
});
export type TableColumns<T extends RowData> = ColumnDef<typeof tableFeatureSet, T>[];

/** What a heading needs of a sortable column, whatever other features its table has. */
interface SortableColumn {
  getIsSorted: () => false | 'asc' | 'desc';
  getCanSort: () => boolean;
  getToggleSortingHandler: () => undefined | ((event: unknown) => void);
}

const ARIA_SORT = { asc: 'ascending', desc: 'descending' } as const;
const SORT_MARK = { asc: '▲', desc: '▼' } as const;

/**
 * A column heading: one that sorts is a button, and screen readers hear which way it is
 * sorted. `buttonClassName` lets a page keep its own heading look.
 */
function SortHeading({ column, buttonClassName, children }: { column: SortableColumn; buttonClassName: string; children: ReactNode }) {
  const sorted = column.getIsSorted();
  return (
    <th scope="col" aria-sort={sorted ? ARIA_SORT[sorted] : undefined} className="px-3 py-2 text-sm font-bold uppercase tracking-wide text-ink-soft">
      {column.getCanSort() ? (
        <button type="button" onClick={column.getToggleSortingHandler()} className={buttonClassName}>
          {children}
          <span aria-hidden>{sorted ? SORT_MARK[sorted] : '↕'}</span>
        </button>
      ) : children}
    </th>
  );
}

/** The heading rows of a table; `render` draws a heading's own content (the table's FlexRender). */
export function SortingHead<H extends { id: string; column: SortableColumn }>({ groups, buttonClassName, render }: {
  groups: { id: string; headers: H[] }[]; buttonClassName: string; render: (header: H) => ReactNode;
}) {
  return (
    <thead className="bg-ink/5">
      {groups.map((hg) => (
        <tr key={hg.id}>
          {hg.headers.map((h) => <SortHeading key={h.id} column={h.column} buttonClassName={buttonClassName}>{render(h)}</SortHeading>)}
        </tr>
      ))}
    </thead>
  );
}

/** The body rows, every other one shaded, or one row saying why there are none. */
export function StripedBody<TFeatures extends TableFeatures, TData extends RowData>({ table, columnCount, empty, emptyClassName }: {
  table: ReactTable<TFeatures, TData, unknown>; columnCount: number; empty: ReactNode; emptyClassName: string;
}) {
  const rows = table.getRowModel().rows;
  return (
    <tbody>
      {rows.map((row, i) => (
        <tr key={row.id} className={cx('border-t border-line', i % 2 === 1 && 'bg-paper/60')}>
          {row.getAllCells().map((cell) => (
            <td key={cell.id} className="px-3 py-2 align-middle">
              <table.FlexRender cell={cell} />
            </td>
          ))}
        </tr>
      ))}
      {rows.length === 0 && (
        <tr>
          <td colSpan={columnCount} className={emptyClassName}>{empty}</td>
        </tr>
      )}
    </tbody>
  );
}

/** A sortable, filterable table for lists of a few hundred rows held on the client. */
export function DataTable<T extends RowData>({ data, columns, label, filterPlaceholder = 'Filter', empty = 'Nothing here yet.' }: {
  data: T[]; columns: TableColumns<T>; label: string; filterPlaceholder?: string; empty?: string;
}) {
  const [globalFilter, setGlobalFilter] = useState('');
  const table = useTable({
    features: tableFeatureSet,
    columns,
    data,
    state: { globalFilter },
    onGlobalFilterChange: setGlobalFilter,
    globalFilterFn: 'includesString',
  });
  return (
    <div className="flex flex-col gap-3">
      <Input aria-label={`Filter ${label}`} placeholder={filterPlaceholder} value={globalFilter} onChange={(e) => setGlobalFilter(e.target.value)} className="max-w-sm" />
      <div className="overflow-x-auto rounded-[var(--radius-card)] border border-line bg-panel">
        <table className="w-full text-left">
          <caption className="sr-only">{label}</caption>
          <SortingHead groups={table.getHeaderGroups()} buttonClassName="inline-flex min-h-8 items-center gap-1 hover:text-ink" render={(h) => <table.FlexRender header={h} />} />
          <StripedBody table={table} columnCount={columns.length} empty={empty} emptyClassName="px-3 py-6 text-center text-ink-soft" />
        </table>
      </div>
    </div>
  );
}
