import { useQuery } from '@tanstack/react-query';
import { Bar, BarChart, CartesianGrid, ErrorBar, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { ProcedureDocument } from '@shared/schema';
import type { AnalyticsQuery } from '@shared/stats/debrief-schema';
import { Alert, Card, Spinner } from '../../../components/ui/card';
import { debriefQueries } from '../api/queries';
import { formatDuration } from '../lib/format';
import { useDebriefFormat } from '../hooks/use-debrief-format';
import { ChartCard } from './chart-card';
import { palette } from '../lib/palette';

/** Median and quartiles of time per step and per diagnosis (type 7 quantiles, stated on screen). */
export function TimesPanel({ q, doc }: { q: AnalyticsQuery; doc: ProcedureDocument }) {
  const { data, isLoading, error } = useQuery(debriefQueries.times(q));
  const df = useDebriefFormat();
  if (isLoading) return <Spinner label="Working out the times" />;
  if (error || !data) return <Alert title="The times could not be loaded">{(error as Error | null)?.message}</Alert>;
  const order = new Map(doc.steps.map((s, i) => [s.id, i]));
  const rows = [...data.steps].sort((a, b) => (order.get(a.stepId) ?? 0) - (order.get(b.stepId) ?? 0)).map((s) => ({
    name: doc.steps.find((x) => x.id === s.stepId)?.title ?? s.stepId, ...s,
    medianMin: (s.median ?? 0) / 60, spread: [((s.median ?? 0) - (s.q1 ?? 0)) / 60, ((s.q3 ?? 0) - (s.median ?? 0)) / 60],
  }));
  const d = data.diagnosis;
  return (
    <div className="flex flex-col gap-4">
      <Card>
        <p className="text-sm font-bold uppercase text-ink-soft">Time per diagnosis (finished or handed off)</p>
        <p className="text-3xl font-bold tabular-nums">{formatDuration(d.median)}</p>
        <p className="text-ink-soft">Median of {df.count(d.n)} diagnoses; the middle half took {formatDuration(d.q1)} to {formatDuration(d.q3)}.</p>
      </Card>
      <ChartCard title="Time per step" question="Which steps take long, and how much do they vary?" csvName="time-per-step"
        table={{ header: ['Step', 'Answers', 'Q1 (min)', 'Median (min)', 'Q3 (min)'], rows: rows.map((r) => [r.name, r.n, df.minutes(r.q1), df.minutes(r.median), df.minutes(r.q3)]) }}
        chart={
          <div style={{ height: 60 + rows.length * 30 }} role="img" aria-label="Median minutes per step with the quartile range">
            <ResponsiveContainer>
              <BarChart data={rows} layout="vertical" margin={{ left: 24, right: 24 }}>
                <CartesianGrid strokeDasharray="3 3" horizontal={false} stroke={palette().line} />
                <XAxis type="number" unit=" min" tickFormatter={(v: number) => df.count(v)} />
                <YAxis type="category" dataKey="name" width={260} interval={0} tick={{ fontSize: 13 }} />
                <Tooltip formatter={(v) => `${df.minutes(Number(v) * 60)} min`} />
                <Bar dataKey="medianMin" name="Median" fill={palette().signal} isAnimationActive={false}>
                  <ErrorBar dataKey="spread" width={6} stroke={palette().ink} direction="x" />
                </Bar>
              </BarChart>
            </ResponsiveContainer>
          </div>
        }
        footer={<span>Bars: median; whiskers: first to third quartile. {data.definition}</span>} />
    </div>
  );
}
