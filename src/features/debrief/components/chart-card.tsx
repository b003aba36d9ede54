import { useState, type ReactNode } from 'react';
import { Card } from '../../../components/ui/card';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { downloadCsv, toCsv } from '../lib/csv';

export interface FigureTable { header: string[]; rows: (string | number | null)[][] }

/** A chart that answers one question, with the same figures as a table and as a CSV download. */
export function ChartCard({ title, question, chart, table, csvName, footer }: {
  title: string; question: string; chart: ReactNode; table: FigureTable; csvName: string; footer?: ReactNode;
}) {
  const [view, setView] = useState<'chart' | 'table'>('chart');
  return (
    <Card className="flex flex-col gap-3">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <h3 className="text-lg">{title}</h3>
          <p className="text-ink-soft">{question}</p>
        </div>
        <div className="flex gap-1" role="group" aria-label={`${title}: view`}>
          {(['chart', 'table'] as const).map((v) => (
            <Button key={v} variant={view === v ? 'primary' : 'ghost'} aria-pressed={view === v} onClick={() => setView(v)}>
              {v === 'chart' ? 'Chart' : 'Table'}
            </Button>
          ))}
          <Button variant="secondary" onClick={() => downloadCsv(`${csvName}.csv`, toCsv(table.header, table.rows))}>Export CSV</Button>
        </div>
      </div>
      {view === 'chart' ? chart : <FigureTableView table={table} caption={title} />}
      {footer && <div className="text-sm text-ink-soft">{footer}</div>}
    </Card>
  );
}

export function FigureTableView({ table, caption }: { table: FigureTable; caption: string }) {
  return (
    <div className="max-h-[28rem] overflow-auto rounded-lg border border-line" tabIndex={0} role="region" aria-label={caption}>
      <table className="w-full text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="sticky top-0 bg-paper">
          <tr>{table.header.map((h) => <th key={h} scope="col" className="px-3 py-2 font-bold text-ink-soft">{h}</th>)}</tr>
        </thead>
        <tbody>
          {table.rows.map((r, i) => (
            <tr key={i} className={cx('border-t border-line', i % 2 === 1 && 'bg-paper/50')}>
              {r.map((c, j) => <td key={j} className={cx('px-3 py-1.5', typeof c === 'number' && 'tabular-nums')}>{c ?? '–'}</td>)}
            </tr>
          ))}
          {table.rows.length === 0 && <tr><td colSpan={table.header.length} className="px-3 py-4 text-center text-ink-soft">No figures for this selection.</td></tr>}
        </tbody>
      </table>
    </div>
  );
}
