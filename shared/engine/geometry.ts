import type { Step } from '../schema/procedure';
import { STEP_TRAITS, handleCount } from './kinds';

/** Distance between the centres of two neighbouring branch handles under a step's box. */
export const HANDLE_PITCH = 96;

/**
 * The size of a step's box on the canvas: wide enough for every band or answer handle side by
 * side. The editor draws with it; layouts (Arrange, the demo procedures) leave room for it.
 */
export function nodeWidth(handles: number): number {
  return Math.max(240, handles * HANDLE_PITCH + 8);
}

export { handleCount } from './kinds';

/** The box a step is drawn in. */
export function stepBox(step: Step): { width: number; height: number } {
  return { width: nodeWidth(handleCount(step)), height: STEP_TRAITS[step.kind].boxHeight };
}

/** Where handle `i` of `n` sits under a step's box, measured from the box's centre. */
export function handleOffset(i: number, n: number): number {
  return (i - (n - 1) / 2) * HANDLE_PITCH;
}
