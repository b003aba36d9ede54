import type { Answer, Part, Step, StepId, StepKind } from '../../schema/procedure';
import type { Quantity } from '../../measure/quantities';
import type { LintFinding } from '../lint-types';
import type { LimitsView } from '../limits-view';

/** The step type of one kind: `StepOf<'task'>` is `TaskStep`. */
export type StepOf<K extends StepKind> = Extract<Step, { kind: K }>;

/** One arrow of the graph. `handle` is stable per source step (the editor's connection point). */
export interface Branch {
  readonly from: StepId;
  readonly to: StepId;
  /** `band:<id>`, `answer:<id>`, `next` or `borderline`. */
  readonly handle: string;
  readonly label: string;
  readonly kind: 'band' | 'answer' | 'next' | 'borderline';
}

/** A handle the canvas draws under a step: connected (`to` set) or still open. */
export interface Outlet {
  readonly handle: string;
  readonly label: string;
  readonly kind: Branch['kind'];
  readonly to?: StepId;
}

/**
 * What the walk does on arriving at a step: wait for the technician's answer, compute it (a
 * Formula), or end the diagnosis with the given status.
 */
export type Arrival =
  | { readonly on: 'answer' }
  | { readonly on: 'compute' }
  | { readonly on: 'end'; readonly status: 'finished' | 'handed_off' };

/** The fields of a StepView that depend on the kind (the common ones are built by `stepView`). */
export interface KindView {
  readonly question?: string;
  readonly answers?: readonly Pick<Answer, 'id' | 'label'>[];
  readonly confirmLabel?: string;
  readonly quantity?: Quantity;
  readonly unit?: string;
  readonly limits?: LimitsView;
  readonly leadNull?: boolean;
  /** The temperature step whose value corrects this copper-winding reading. */
  readonly temperatureStep?: string;
  readonly cause?: string;
  readonly repair?: string;
  readonly parts?: readonly Part[];
  readonly reason?: string;
  /** The procedure a "Continue in" step goes on in (its slug). */
  readonly procedure?: string;
}

/**
 * Everything the engine, the server and the screens need to know about one step kind. One object
 * per kind in `kinds/<kind>.ts`; `STEP_TRAITS` holds them all, keyed by kind, so a new kind that
 * lacks one is a compile error.
 */
export interface KindTraits<K extends StepKind> {
  readonly kind: K;
  /** The name authors, technicians and trainers read ("Hand-off"). */
  readonly label: string;
  readonly arrival: Arrival;
  /** An independent check the check-order advisor may move (Readings and Observations). */
  readonly check: boolean;
  /** The diagnosis may end at the step (a Finding, a Hand-off, a link whose other procedure ends it). */
  ends(step: StepOf<K>): boolean;
  /** Takes the technician time: the procedure's minutes per step apply when the step gives none. */
  readonly takesTime: boolean;
  /** Height of the step's box on the canvas (ISO 5807 outline inside). */
  readonly boxHeight: number;
  /** Every handle, in branch order, open ones included. */
  outlets(step: StepOf<K>): Outlet[];
  /** Each connected branch's target in `outlets` order (numbered among connected ones), without allocating. */
  eachTarget(step: StepOf<K>, visit: (to: StepId, local: number) => void): void;
  /** The step with the branch behind `handle` pointed at `to`, or cleared when `to` is undefined. */
  setBranch(step: StepOf<K>, handle: string, to: StepId | undefined): StepOf<K>;
  /** Soundness findings about the step alone. */
  lint(step: StepOf<K>): LintFinding[];
  /** What the Bench shows for the step beyond the common fields. */
  view(step: StepOf<K>): KindView;
}

/** For a switch over kinds: reaching here means a kind was left out, which the compiler reports. */
export function unknownKind(kind: never): never {
  throw new Error(`Unknown step kind ${String((kind as { kind?: unknown })?.kind ?? kind)}`);
}
