import { useQuery } from '@tanstack/react-query';
import { Bar, BarChart, CartesianGrid, Cell, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { ProcedureDocument } from '@shared/schema';
import type { AnalyticsQuery, ReadingFigure } from '@shared/stats/debrief-schema';
import { Alert, EmptyState, Spinner } from '../../../components/ui/card';
import { debriefQueries } from '../api/queries';
import { useDebriefFormat } from '../hooks/use-debrief-format';
import { ChartCard } from './chart-card';
import { palette } from '../lib/palette';

/** A bin's colour by where it lies against the limits: inside, outside, or across a limit. */
function binColour(bin: { lo: number; hi: number }, limits: ReadingFigure['limits']): string {
  const { min, max } = limits;
  const p = palette();
  const crosses = (l?: number) => l !== undefined && bin.lo < l && bin.hi > l;
  if (crosses(min) || crosses(max)) return p.edge;
  if ((min !== undefined && bin.hi <= min) || (max !== undefined && bin.lo >= max)) return p.stop;
  return p.go;
}

function ReadingCard({ r, title }: { r: ReadingFigure; title: string }) {
  const df = useDebriefFormat();
  const fmt = (v: number | null) => df.value(v, r.quantity, r.unit);
  const bins = r.bins.map((b) => ({ ...b, label: `${fmt(b.lo)} – ${fmt(b.hi)}` }));
  const limitText = [r.limits.min !== undefined ? `min ${fmt(r.limits.min)}` : null, r.limits.max !== undefined ? `max ${fmt(r.limits.max)}` : null].filter(Boolean).join(', ');
  return (
    <ChartCard title={title} csvName={`readings-${r.stepId}`}
      question={`${df.count(r.n)} readings against the limits (${limitText || 'none set'}); ${df.percent(r.borderlineShare, 1)} borderline verdicts.`}
      table={{
        header: ['Technician', 'Readings', 'Q1', 'Median', 'Q3', 'Borderline'],
        rows: r.byTechnician.map((t) => [t.technicianName, t.n, fmt(t.q1), fmt(t.median), fmt(t.q3), `${t.borderline} (${df.percent(t.n ? t.borderline / t.n : null)})`]),
      }}
      chart={
        <div className="flex flex-col gap-3">
          <div className="h-64" role="img" aria-label={`Histogram of ${title} readings; limits ${limitText}`}>
            <ResponsiveContainer>
              <BarChart data={bins} barCategoryGap={1} margin={{ left: 8, right: 8, bottom: 40 }}>
                <CartesianGrid strokeDasharray="3 3" vertical={false} stroke={palette().line} />
                <XAxis dataKey="label" angle={-35} textAnchor="end" interval={1} tick={{ fontSize: 11 }} height={60} />
                <YAxis allowDecimals={false} />
                <Tooltip />
                <Bar dataKey="count" name="Readings" isAnimationActive={false}>
                  {bins.map((b, i) => <Cell key={i} fill={binColour(b, r.limits)} />)}
                </Bar>
              </BarChart>
            </ResponsiveContainer>
          </div>
          <table className="w-full text-left text-sm">
            <caption className="text-left font-semibold">Values by technician (median and quartiles)</caption>
            <thead><tr className="text-ink-soft"><th scope="col">Technician</th><th scope="col">Readings</th><th scope="col">Q1</th><th scope="col">Median</th><th scope="col">Q3</th><th scope="col">Borderline</th></tr></thead>
            <tbody>
              {r.byTechnician.map((t) => (
                <tr key={t.technicianId} className="border-t border-line tabular-nums">
                  <td>{t.technicianName}</td><td>{t.n}</td><td>{fmt(t.q1)}</td><td className="font-semibold">{fmt(t.median)}</td><td>{fmt(t.q3)}</td>
                  <td>{df.percent(t.n ? t.borderline / t.n : null)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      }
      footer={<span>Green bins lie within the limits, red outside, violet across a limit. Limits are illustrative for the demo; the manufacturer's service data and local regulations come first.</span>} />
  );
}

/** For each Reading step: the values against the limits, the borderline share and the values by technician. */
export function ReadingsPanel({ q, doc }: { q: AnalyticsQuery; doc: ProcedureDocument }) {
  const { data, isLoading, error } = useQuery(debriefQueries.readings(q));
  if (isLoading) return <Spinner label="Sorting readings into bins" />;
  if (error || !data) return <Alert title="The readings could not be loaded">{(error as Error | null)?.message}</Alert>;
  if (!data.readings.length) return <EmptyState title="No readings recorded in this selection" />;
  const order = new Map(doc.steps.map((s, i) => [s.id, i]));
  return (
    <div className="grid gap-4 xl:grid-cols-2">
      {[...data.readings].sort((a, b) => (order.get(a.stepId) ?? 0) - (order.get(b.stepId) ?? 0)).map((r) => (
        <ReadingCard key={r.stepId} r={r} title={doc.steps.find((s) => s.id === r.stepId)?.title ?? r.stepId} />
      ))}
    </div>
  );
}
