import type { Band, FormulaStep, ReadingStep, Step } from '../schema/procedure';
import { checkBandCoverage, type BandProblem, type End } from '../measure/bands';
import { formatLimit } from '../measure/format';
import { QUANTITY_INFO } from '../measure/quantities';
import { resolveLimits } from '../measure/verdict';
import { finding, named, type LintFinding } from './lint-types';

function endText(step: ReadingStep | FormulaStep, end: End | undefined, side: 'lower' | 'upper'): string {
  if (!end) return side === 'lower' ? 'minus infinity' : 'infinity';
  return `${formatLimit(end.value, step.quantity, step.unit)} (${end.inclusive ? 'included' : 'excluded'})`;
}

function bandMessage(step: ReadingStep | FormulaStep, p: BandProblem): LintFinding {
  const where = (lo?: End, hi?: End) =>
    lo && hi && lo.value === hi.value ? `exactly ${formatLimit(lo.value, step.quantity, step.unit)}` : `from ${endText(step, lo, 'lower')} to ${endText(step, hi, 'upper')}`;
  switch (p.kind) {
    case 'gap':
      return finding('band-gap', 'error', [step.id],
        `The bands of ${named(step)} leave a gap: a value ${where(p.lower, p.upper)} has no band to go to; widen a band to cover it.`);
    case 'overlap':
      return finding('band-overlap', 'error', [step.id],
        `The bands "${p.bands[0]}" and "${p.bands[1]}" of ${named(step)} overlap ${where(p.lower, p.upper)}, so a value there could go two ways; make them meet at one edge.`);
    case 'empty':
      return finding('band-empty', 'error', [step.id],
        `The band "${p.band}" of ${named(step)} contains no value (its lower end is not below its upper end); fix its ends.`);
  }
}

export function duplicateHandles(step: Step, ids: readonly string[], what: string): LintFinding[] {
  const seen = new Set<string>();
  const out: LintFinding[] = [];
  for (const id of ids) {
    if (seen.has(id)) out.push(finding('duplicate-handle', 'error', [step.id], `Two ${what} of ${named(step)} have the id "${id}"; give each its own.`));
    seen.add(id);
  }
  return out;
}

function lintLimits(step: ReadingStep | FormulaStep): LintFinding[] {
  if (!step.limits) {
    return step.kind === 'reading'
      ? [finding('missing-limits', 'error', [step.id], `${named(step)} measures ${QUANTITY_INFO[step.quantity].label} but has no limits; enter them from the service data.`)]
      : [];
  }
  const { min, max } = resolveLimits(step.limits);
  if (min === undefined && max === undefined) {
    return [finding('limits-invalid', 'error', [step.id], `The limits of ${named(step)} give neither a minimum nor a maximum; enter at least one.`)];
  }
  if (min !== undefined && max !== undefined && min > max) {
    return [finding('limits-invalid', 'error', [step.id], `The minimum of ${named(step)} is above its maximum; swap them.`)];
  }
  return [];
}

function lintBands(step: ReadingStep | FormulaStep, bands: readonly Band[]): LintFinding[] {
  if (bands.length === 0) return [];
  return [...duplicateHandles(step, bands.map((b) => b.id), 'bands'), ...checkBandCoverage(bands).map((p) => bandMessage(step, p))];
}

/** A Reading on its own: limits, bands, meter for guarded acceptance, winding correction. */
export function lintReading(step: ReadingStep): LintFinding[] {
  const out = [...lintLimits(step), ...lintBands(step, step.bands)];
  if (step.decision === 'guarded' && !step.meter) {
    out.push(finding('meter-missing', 'warning', [step.id],
      `${named(step)} uses guarded acceptance but names no meter accuracy, so no reading can be borderline; add the meter spec.`));
  }
  if (step.winding && step.quantity !== 'resistance') {
    out.push(finding('winding-invalid', 'error', [step.id], `${named(step)} asks for copper-winding correction, which applies to resistance readings only.`));
  }
  return out;
}

/** A Formula on its own: limits, bands, and one way of routing. */
export function lintFormulaShape(step: FormulaStep): LintFinding[] {
  const out = [...lintLimits(step), ...lintBands(step, step.bands)];
  if (step.next !== undefined && step.bands.length > 0) {
    out.push(finding('formula-routing', 'error', [step.id], `${named(step)} has both a next step and bands; keep one of them.`));
  }
  return out;
}
