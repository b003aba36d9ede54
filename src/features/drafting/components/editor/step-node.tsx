import { memo } from 'react';
import { Handle, Position, type NodeProps } from '@xyflow/react';
import { cx } from '../../../../components/ui/cx';
import type { StepNode } from '../../lib/flow';
import { KIND_LABELS } from '../labels';
import { KIND_TONE, OUTLINE, OutlineShape, StepGlyph } from './step-glyphs';
import { nodeWidth } from '@shared/engine/geometry';

/**
 * One step on the canvas: the ISO 5807 outline with the title inside, and below it one labelled
 * handle per band or answer to drag a branch from. Open (unconnected) handles are hollow.
 */
export const StepNodeView = memo(function StepNodeView({ data, selected }: NodeProps<StepNode>) {
  const { step, handles, isStart, issue, onPath, current, change } = data;
  const decision = OUTLINE[step.kind] === 'decision';
  const tone = KIND_TONE[step.kind];
  const removed = change === 'removed';
  return (
    <div
      style={{ width: nodeWidth(handles.length) }}
      className={cx('rounded-md', selected && 'ring-4 ring-signal/70', current && 'ring-4 ring-ink', onPath && !current && !selected && 'ring-4 ring-go/50')}
      data-step-id={step.id}
      data-testid={`step-${step.id}`}
    >
      {!removed && <Handle type="target" id="in" position={Position.Top} className="!h-3 !w-3 !border-2 !border-ink !bg-panel" />}
      {/* a removed step is faded; its red badge is not */}
      <div className={cx('relative flex flex-col items-center justify-center text-center', decision ? 'h-[112px] px-12' : 'h-[76px] px-4', removed && 'opacity-45 grayscale')}>
        <OutlineShape kind={step.kind} strokeWidth={issue ? 3 : 2} dashed={change === 'added' || removed} />
        <div className={cx('relative flex items-center gap-1 text-xs font-bold uppercase tracking-wide', tone.text)}>
          <StepGlyph kind={step.kind} className="h-4 w-4" />{KIND_LABELS[step.kind]}
        </div>
        <div className="relative line-clamp-2 text-sm font-semibold leading-tight text-ink">{step.title}</div>
        <div className="relative font-mono text-[11px] text-ink-soft">{step.id}</div>
      </div>
      <div className="pointer-events-none absolute -top-3 left-1 flex gap-1">
        {isStart && <span className="rounded bg-ink px-1.5 text-[11px] font-bold uppercase text-white">Start</span>}
        {issue && <span className={cx('rounded px-1.5 text-[11px] font-bold uppercase', issue === 'error' ? 'bg-stop text-white' : 'bg-caution text-ink')}>{issue}</span>}
        {change && <span className={cx('rounded px-1.5 text-[11px] font-bold uppercase text-white', removed ? 'bg-stop' : 'bg-signal')}>{change}</span>}
      </div>
      {handles.length > 0 && (
        <div className="mt-1 flex justify-center gap-1">
          {handles.map((h) => (
            <div key={h.id} className={cx('relative w-[92px] rounded border bg-panel px-1.5 pb-2 text-center text-[11px] font-semibold', h.open ? 'border-dashed border-stop text-stop' : 'border-line text-ink')} title={h.label}>
              <span className="block truncate">{h.label}</span>
              <Handle type="source" id={h.id} position={Position.Bottom} data-testid={`handle-${step.id}-${h.id}`}
                className={cx('!h-3.5 !w-3.5 !border-2', h.open ? '!border-stop !bg-panel' : '!border-ink !bg-ink')} />
            </div>
          ))}
        </div>
      )}
    </div>
  );
});

export const nodeTypes = { step: StepNodeView };
