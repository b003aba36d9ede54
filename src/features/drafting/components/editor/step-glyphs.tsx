import { STEP_KINDS, type StepKind } from '@shared/schema';
import { KIND_EDITORS, type KindEditor, type Outline } from '../../kinds';

export function StepGlyph({ kind, className = 'h-5 w-5' }: { kind: StepKind; className?: string }) {
  return (
    <svg viewBox="0 0 20 20" className={className} fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden>
      <path d={KIND_EDITORS[kind].glyph} />
    </svg>
  );
}

export type { Outline } from '../../kinds';

/** ISO 5807 outline per kind: decisions are diamonds, endings terminators, the rest processes. */
export const OUTLINE = Object.fromEntries(STEP_KINDS.map((k) => [k, KIND_EDITORS[k].outline])) as Record<StepKind, Outline>;

/** Our colours per kind (fill, stroke, text class). */
export const KIND_TONE = Object.fromEntries(STEP_KINDS.map((k) => [k, KIND_EDITORS[k].tone])) as Record<StepKind, KindEditor<StepKind>['tone']>;

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
