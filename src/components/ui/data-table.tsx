import { useState } from 'react';
import {
  useTable, tableFeatures, rowSortingFeature, globalFilteringFeature, columnFilteringFeature,
  createSortedRowModel, createFilteredRowModel, sortFns, filterFns, type ColumnDef, type RowData,
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
  const rows = table.getRowModel().rows;
  return (
    <div className="flex flex-col gap-3">
      <Input aria-label={`Filter ${label}`} placeholder={filterPlaceholder} value={globalFilter} onChange={(e) => setGlobalFilter(e.target.value)} className="max-w-sm" />
      <div className="overflow-x-auto rounded-[var(--radius-card)] border border-line bg-panel">
        <table className="w-full text-left">
          <caption className="sr-only">{label}</caption>
          <thead className="bg-ink/5">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  const canSort = h.column.getCanSort();
                  return (
                    <th key={h.id} scope="col" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined} className="px-3 py-2 text-sm font-bold uppercase tracking-wide text-ink-soft">
                      {canSort ? (
                        <button type="button" onClick={h.column.getToggleSortingHandler()} className="inline-flex min-h-8 items-center gap-1 hover:text-ink">
                          <table.FlexRender header={h} />
                          <span aria-hidden>{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                        </button>
                      ) : (
                        <table.FlexRender header={h} />
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
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
                <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-soft">{empty}</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
