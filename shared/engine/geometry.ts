import type { Step } from '../schema/procedure';

/** Distance between the centres of two neighbouring branch handles under a step's box. */
export const HANDLE_PITCH = 96;

/**
 * The size of a step's box on the canvas: wide enough for every band or answer handle side by
 * side. The editor draws with it; layouts (Arrange, the demo procedures) leave room for it.
 */
export function nodeWidth(handles: number): number {
  return Math.max(240, handles * HANDLE_PITCH + 8);
}

function nodeSize(kind: string, handles: number): { width: number; height: number } {
  return { width: nodeWidth(handles), height: kind === 'reading' || kind === 'observation' ? 150 : kind === 'task' || kind === 'formula' ? 110 : 80 };
}

/** How many branch handles the canvas draws under a step (a Task, and a Formula without bands, have one). */
export function handleCount(step: Step): number {
  switch (step.kind) {
    case 'reading': return step.bands.length + (step.borderline.action === 'branch' ? 1 : 0);
    case 'formula': return step.bands.length || 1;
    case 'observation': return step.answers.length;
    case 'task': return 1;
    default: return 0;
  }
}

/** The box a step is drawn in. */
export function stepBox(step: Step): { width: number; height: number } {
  return nodeSize(step.kind, handleCount(step));
}

/** Where handle `i` of `n` sits under a step's box, measured from the box's centre. */
export function handleOffset(i: number, n: number): number {
  return (i - (n - 1) / 2) * HANDLE_PITCH;
}
