import type { Band, StepId } from '../../schema/procedure';
import type { Outlet } from './types';

/**
 * A branch drawn but not yet connected points here. The id is valid for the schema but never given
 * to a step (the editor never makes ids that start with "_"), so the soundness check reports it as
 * a dangling branch until the author connects it.
 */
export const UNCONNECTED = '_unconnected';

/** The handles of a Reading's or Formula's bands, in order. */
export function bandOutlets(bands: readonly Band[]): Outlet[] {
  return bands.map((b) => ({ handle: `band:${b.id}`, label: b.label, kind: 'band', to: b.next }));
}

/** The bands with the one behind `handle` pointed at `to` (cleared to UNCONNECTED); null when `handle` is no band's. */
export function setBandBranch(bands: readonly Band[], handle: string, to: StepId | undefined): Band[] | null {
  if (!handle.startsWith('band:')) return null;
  const id = handle.slice(5);
  return bands.map((b) => (b.id === id ? { ...b, next: to ?? UNCONNECTED } : b));
}

/** An optional `next` set or cleared (a missing `next` is the cleared state). */
export function withNext<S extends { next?: StepId | undefined }>(step: S, to: StepId | undefined): S {
  const { next: _drop, ...rest } = step;
  return (to === undefined ? rest : { ...rest, next: to }) as S;
}

/** The traits every ending shares: no branches, no time of its own, a small terminator box. */
export function endingTraits(status: 'finished' | 'handed_off') {
  return {
    arrival: { on: 'end', status },
    check: false,
    ends: () => true,
    takesTime: false,
    boxHeight: 80,
    outlets: () => [],
    eachTarget: () => {},
    setBranch: <S>(step: S) => step,
  } as const;
}
