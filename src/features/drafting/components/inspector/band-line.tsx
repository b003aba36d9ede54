import { checkBandCoverage, type Quantity } from '@shared/measure';
import type { Band } from '@shared/schema';
import { useFormat } from '../../../../lib/format';

const W = 320;
const ROW = 16;
/** Room on the left for the band names; the number line uses the rest. */
const LABEL = 78;

/**
 * The bands on a number line, one row each, with gaps (red) and overlaps (violet) drawn on the
 * bottom row: the coverage problems come from the shared band check, this only draws them.
 */
export function BandLine({ bands, quantity, unit }: { bands: Band[]; quantity: Quantity; unit: string }) {
  const problems = checkBandCoverage(bands);
  const fmt = useFormat();
  const limitText = (v: number) => fmt.limit(v, quantity, unit);
  const ends = bands.flatMap((b) => [b.lower?.value, b.upper?.value]).filter((v): v is number => v !== undefined);
  const lo = ends.length ? Math.min(...ends) : 0;
  const hi = ends.length ? Math.max(...ends) : 1;
  const pad = (hi - lo || Math.abs(hi) || 1) * 0.25;
  const x = (v: number | undefined, side: 'lo' | 'hi') =>
    LABEL + (v === undefined ? (side === 'lo' ? 0 : W - LABEL) : ((v - (lo - pad)) / (hi - lo + 2 * pad)) * (W - LABEL));
  const height = (bands.length + 1) * ROW + 22;
  const marks = [...new Set(ends)].sort((a, b) => a - b);
  return (
    <figure className="rounded-lg border border-line bg-paper p-2">
      <svg viewBox={`0 0 ${W} ${height}`} className="w-full" role="img" aria-label={`Bands on a number line; ${problems.length === 0 ? 'no gaps or overlaps' : `${problems.length} problem(s)`}`}>
        {bands.map((b, i) => (
          <g key={b.id}>
            <rect x={x(b.lower?.value, 'lo')} y={i * ROW + 2} width={Math.max(2, x(b.upper?.value, 'hi') - x(b.lower?.value, 'lo'))} height={ROW - 4} rx={3} fill="var(--color-signal-soft)" stroke="var(--color-signal)" />
            <text x={LABEL - 4} y={i * ROW + 12} fontSize={10} textAnchor="end" fill="var(--color-ink)">{b.label.length > 14 ? `${b.label.slice(0, 13)}…` : b.label}</text>
          </g>
        ))}
        {problems.map((p, i) => p.kind === 'empty' ? null : (
          <rect key={i} x={x(p.lower?.value, 'lo')} y={bands.length * ROW + 2} width={Math.max(3, x(p.upper?.value, 'hi') - x(p.lower?.value, 'lo'))} height={ROW - 4}
            fill={p.kind === 'gap' ? 'var(--color-stop)' : 'var(--color-edge)'} data-testid={`band-${p.kind}`} />
        ))}
        <text x={LABEL - 4} y={bands.length * ROW + 12} fontSize={10} textAnchor="end" fill="var(--color-ink-soft)">gaps/overlaps</text>
        <line x1={LABEL} x2={W} y1={(bands.length + 1) * ROW} y2={(bands.length + 1) * ROW} stroke="var(--color-ink-soft)" />
        {marks.map((m) => (
          <g key={m}>
            <line x1={x(m, 'lo')} x2={x(m, 'lo')} y1={(bands.length + 1) * ROW - 3} y2={(bands.length + 1) * ROW + 3} stroke="var(--color-ink)" />
            <text x={x(m, 'lo')} y={(bands.length + 1) * ROW + 15} fontSize={9} textAnchor="middle" fill="var(--color-ink-soft)">{limitText(m)}</text>
          </g>
        ))}
      </svg>
      <figcaption className="text-xs text-ink-soft">
        {problems.length === 0 ? 'Bands cover the whole number line once.' : problems.map((p) => p.kind === 'gap'
          ? `Gap ${p.lower ? limitText(p.lower.value) : '−∞'} … ${p.upper ? limitText(p.upper.value) : '+∞'}`
          : p.kind === 'overlap' ? `Overlap of ${p.bands.join(' and ')}` : `Band ${p.band} is empty`).join('; ')}
      </figcaption>
    </figure>
  );
}
