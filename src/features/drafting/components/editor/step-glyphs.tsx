import type { StepKind } from '@shared/schema';

// Our own small glyphs for the six step kinds, drawn on a 20×20 grid.
const PATHS: Record<StepKind, string> = {
  reading: 'M3 14a7 7 0 0 1 14 0M10 14l4-5M10 14h0',
  observation: 'M2 10c2.5-4 5-6 8-6s5.5 2 8 6c-2.5 4-5 6-8 6s-5.5-2-8-6zM10 12.5a2.5 2.5 0 1 0 0-5 2.5 2.5 0 0 0 0 5z',
  task: 'M4 10.5l4 4 8-9',
  formula: 'M13 3.5c-2 0-3 1-3.4 3L7.6 16.5c-.4 2-1.4 3-3.1 3M5.5 9h7',
  finding: 'M5 18V3M5 3h10l-2.5 3.5L15 10H5',
  handoff: 'M3 10h11M10 5l5 5-5 5M17 4v12',
};

export function StepGlyph({ kind, className = 'h-5 w-5' }: { kind: StepKind; className?: string }) {
  return (
    <svg viewBox="0 0 20 20" className={className} fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden>
      <path d={PATHS[kind]} />
    </svg>
  );
}

/** ISO 5807 outline per kind: decisions are diamonds, endings terminators, the rest processes. */
export type Outline = 'process' | 'decision' | 'terminal';
export const OUTLINE: Record<StepKind, Outline> = {
  reading: 'decision', observation: 'decision', task: 'process', formula: 'process', finding: 'terminal', handoff: 'terminal',
};

/** Our colours per kind (fill, stroke), from the design tokens. */
export const KIND_TONE: Record<StepKind, { fill: string; stroke: string; text: string }> = {
  reading: { fill: 'var(--color-signal-soft)', stroke: 'var(--color-signal)', text: 'text-signal' },
  observation: { fill: '#e3edf8', stroke: 'var(--color-notice)', text: 'text-notice' },
  task: { fill: 'var(--color-panel)', stroke: 'var(--color-ink)', text: 'text-ink' },
  formula: { fill: '#eef0f2', stroke: 'var(--color-ink-soft)', text: 'text-ink-soft' },
  finding: { fill: 'var(--color-go-soft)', stroke: 'var(--color-go)', text: 'text-go' },
  handoff: { fill: 'var(--color-edge-soft)', stroke: 'var(--color-edge)', text: 'text-edge' },
};

/** The outline as an SVG drawn behind a node's text, stretched to the node's box. */
export function OutlineShape({ kind, strokeWidth = 2, dashed = false }: { kind: StepKind; strokeWidth?: number; dashed?: boolean }) {
  const tone = KIND_TONE[kind];
  const common = { fill: tone.fill, stroke: tone.stroke, strokeWidth, vectorEffect: 'non-scaling-stroke' as const, strokeDasharray: dashed ? '6 4' : undefined };
  return (
    <svg className="pointer-events-none absolute inset-0 h-full w-full" viewBox="0 0 100 100" preserveAspectRatio="none" aria-hidden>
      {OUTLINE[kind] === 'decision' && <polygon points="50,1 99,50 50,99 1,50" {...common} />}
      {OUTLINE[kind] === 'process' && <rect x="1" y="1" width="98" height="98" {...common} />}
      {OUTLINE[kind] === 'terminal' && <rect x="1" y="1" width="98" height="98" rx="14" ry="49" {...common} />}
    </svg>
  );
}
