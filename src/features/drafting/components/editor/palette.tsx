import { STEP_KINDS, type StepKind } from '@shared/schema';
import { KIND_LABELS } from '../labels';
import { KIND_EDITORS } from '../../kinds';
import { PALETTE_MIME } from './canvas';
import { KIND_TONE, OUTLINE, OutlineShape, StepGlyph } from './step-glyphs';

/** The step kinds: drag one onto the canvas, or press it to add it in the middle of the view. */
export function Palette({ disabled, onAdd }: { disabled: boolean; onAdd: (kind: StepKind) => void }) {
  return (
    <nav aria-label="Step kinds" className="flex flex-col gap-2">
      <h2 className="text-sm font-bold uppercase tracking-wide text-ink-soft">Add a step</h2>
      {STEP_KINDS.map((kind) => (
        <button
          key={kind}
          type="button"
          draggable={!disabled}
          disabled={disabled}
          onDragStart={(e) => { e.dataTransfer.setData(PALETTE_MIME, kind); e.dataTransfer.effectAllowed = 'copy'; }}
          onClick={() => onAdd(kind)}
          className="group flex min-h-12 items-center gap-2 rounded-lg border border-line bg-panel p-1.5 text-left hover:border-ink disabled:opacity-50"
          data-testid={`palette-${kind}`}
          title={KIND_EDITORS[kind].hint}
        >
          <span className={`relative flex h-9 w-12 shrink-0 items-center justify-center ${KIND_TONE[kind].text}`}>
            <OutlineShape kind={kind} />
            <StepGlyph kind={kind} className="relative h-4 w-4" />
          </span>
          <span className="flex flex-col leading-tight">
            <span className="font-semibold">{KIND_LABELS[kind]}</span>
            <span className="text-xs text-ink-soft">{OUTLINE[kind] === 'decision' ? 'decision' : OUTLINE[kind] === 'terminal' ? 'ending' : 'process'}</span>
          </span>
        </button>
      ))}
    </nav>
  );
}
