import type { PathFigures } from '@shared/engine';
import { useFormat } from '../../../../lib/format';

function Figure({ label, steps, minutes }: { label: string; steps: number | null; minutes: number | null }) {
  const f = useFormat();
  const fmt = (n: number) => (Number.isInteger(n) ? f.count(n) : f.fixed(n, 1));
  return (
    <div className="flex items-baseline justify-between gap-2 border-b border-line py-1 last:border-0">
      <dt className="text-ink-soft">{label}</dt>
      <dd className="font-semibold tabular-nums">{steps === null ? '—' : `${fmt(steps)} steps · ${fmt(minutes ?? 0)} min`}</dd>
    </div>
  );
}

/** Path figures from the shared engine: how long a diagnosis along this procedure takes. */
export function FiguresPanel({ figures }: { figures: PathFigures | null }) {
  return (
    <section aria-labelledby="figures-title">
      <h2 id="figures-title" className="text-sm font-bold uppercase tracking-wide text-ink-soft">Path figures</h2>
      {!figures ? <p className="text-sm text-ink-soft">Figures appear once the procedure can be walked.</p> : (
        <dl className="text-sm" data-testid="figures">
          <Figure label="Shortest to an ending" steps={figures.shortest?.steps ?? null} minutes={figures.shortest?.minutes ?? null} />
          <Figure label="Longest without repeats" steps={figures.longest?.steps ?? null} minutes={figures.longest?.minutes ?? null} />
          <Figure label="Expected (branches equally likely)" steps={figures.expected?.steps ?? null} minutes={figures.expected?.minutes ?? null} />
          {figures.hasLoops && <p className="pt-1 text-xs text-ink-soft">The procedure has loops; the expected figures count going round them.</p>}
        </dl>
      )}
    </section>
  );
}
