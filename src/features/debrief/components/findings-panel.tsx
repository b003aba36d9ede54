import { useQuery } from '@tanstack/react-query';
import { Bar, BarChart, CartesianGrid, Cell, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { ProcedureDocument } from '@shared/schema';
import type { AnalyticsQuery } from '@shared/stats/debrief-schema';
import { Alert, Card, Spinner } from '../../../components/ui/card';
import { debriefQueries } from '../api/queries';
import { STATUS_LABEL } from '../lib/format';
import { useDebriefFormat } from '../hooks/use-debrief-format';
import { ChartCard } from './chart-card';
import { palette } from '../lib/palette';


/** How diagnoses end, and how often the fix held (first-time fix). */
export function FindingsPanel({ q, doc }: { q: AnalyticsQuery; doc: ProcedureDocument }) {
  const { data, isLoading, error } = useQuery(debriefQueries.findings(q));
  const df = useDebriefFormat();
  if (isLoading) return <Spinner label="Counting endings" />;
  if (error || !data) return <Alert title="The findings could not be loaded">{(error as Error | null)?.message}</Alert>;
  const title = (id: string) => doc.steps.find((s) => s.id === id)?.title ?? id;
  const rows = data.endings.map((e) => ({
    name: e.status === 'finished' ? title(e.stepId) : `${title(e.stepId)} (${STATUS_LABEL[e.status].toLowerCase()})`, status: e.status, count: e.count, share: e.share,
  }));
  const top = Math.max(0.05, ...rows.map((r) => r.share));
  const ftf = data.firstTimeFix;
  const p = palette();
  const COLOUR = { finished: p.go, handed_off: p.signal, abandoned: p.stop, active: p.inkSoft };
  return (
    <div className="flex flex-col gap-4">
      <div className="grid gap-4 md:grid-cols-3">
        <Card><p className="text-sm font-bold uppercase text-ink-soft">First-time fix</p><p className="text-3xl font-bold">{df.percent(ftf.rate, 1)}</p>
          <p className="text-ink-soft">{df.count(ftf.finished - ftf.comebacks)} of {df.count(ftf.finished)} finished diagnoses had no comeback of the vehicle within {ftf.comebackDays} days.</p></Card>
        <Card><p className="text-sm font-bold uppercase text-ink-soft">Comebacks</p><p className="text-3xl font-bold">{df.count(ftf.comebacks)}</p>
          <p className="text-ink-soft">The same vehicle started another diagnosis within {ftf.comebackDays} days (shop setting).</p></Card>
        <Card><p className="text-sm font-bold uppercase text-ink-soft">Ended diagnoses</p><p className="text-3xl font-bold">{df.count(data.ended)}</p>
          <p className="text-ink-soft">Finished, handed off or abandoned in this selection.</p></Card>
      </div>
      <ChartCard title="How diagnoses end" question="Which findings are common, and where do technicians hand off or give up?" csvName="endings"
        table={{ header: ['Ending step', 'Status', 'Diagnoses', 'Share'], rows: rows.map((r) => [r.name, STATUS_LABEL[r.status], r.count, df.percent(r.share, 1)]) }}
        chart={
          <div style={{ height: 60 + rows.length * 30 }} role="img" aria-label="Bar chart of the share of each ending">
            <ResponsiveContainer>
              <BarChart data={rows} layout="vertical" margin={{ left: 24, right: 24 }}>
                <CartesianGrid strokeDasharray="3 3" horizontal={false} stroke={p.line} />
                <XAxis type="number" domain={[0, Math.ceil(top * 20) / 20]} tickCount={6} tickFormatter={(v: number) => df.percent(v)} />
                <YAxis type="category" dataKey="name" width={260} interval={0} tick={{ fontSize: 13 }} />
                <Tooltip formatter={(v) => df.percent(Number(v), 1)} labelFormatter={(l) => String(l)} />
                <Bar dataKey="share" name="Share of ended diagnoses" isAnimationActive={false}>
                  {rows.map((r, i) => <Cell key={i} fill={COLOUR[r.status]} />)}
                </Bar>
              </BarChart>
            </ResponsiveContainer>
          </div>
        }
        footer={<span>Green: finished with a finding · orange: handed off · red: abandoned at that step.</span>} />
    </div>
  );
}
