import type { ProcedureDocument } from '../schema/procedure';
import { branchesOf } from './kinds';
import type { StepFigures } from './figures';

type PerStep = Readonly<Record<string, StepFigures>>;

/** Steps still to be shown after the current one (its ending included), as a range over its branches. */
export interface StepsToGo {
  readonly low: number;
  readonly high: number;
}

/**
 * How many steps are likely after `stepId`: the expected steps from each of its branches (path
 * figures: recorded branch frequencies where there are any, equal branches otherwise), lowest
 * and highest, rounded. Null when an ending may never be reached (a loop without figures).
 * Example: at the plug-cap reading of "No spark", `{ low: 1, high: 8 }` (faulty cap or go on).
 */
export function stepsToGo(doc: ProcedureDocument, perStep: PerStep, stepId: string): StepsToGo | null {
  const step = doc.steps.find((s) => s.id === stepId);
  if (!step) return null;
  const ahead = branchesOf(step).filter((b) => b.kind !== 'borderline').map((b) => perStep[b.to]?.expectedSteps ?? Infinity);
  if (ahead.length === 0) return { low: 0, high: 0 };
  if (!ahead.every(Number.isFinite)) return null;
  return { low: Math.round(Math.min(...ahead)), high: Math.round(Math.max(...ahead)) };
}

/**
 * How far one answer moved the estimate, in steps: the expected steps from the branch taken
 * (`takenId`) less what was expected after `fromId` before it was answered. About 0 when the
 * answer took an average branch; ≥ 1 when it leads to the longer branch, ≤ −1 to a shorter one.
 * Example: branchJump(perStep, 'capOhms', 'groundCheck') > 1 (the cap was fine: the long way on).
 */
export function branchJump(perStep: PerStep, fromId: string, takenId: string): number {
  const before = perStep[fromId]?.expectedSteps;
  const after = perStep[takenId]?.expectedSteps;
  if (before === undefined || after === undefined || !Number.isFinite(before) || !Number.isFinite(after)) return 0;
  return after - (before - 1);
}
