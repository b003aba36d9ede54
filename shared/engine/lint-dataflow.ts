import type { FormulaStep, ReadingStep } from '../schema/procedure';
import { evaluateFormula, parseFormula, type FormulaValue } from '../measure/formula';
import type { Dominators } from './algorithms';
import type { ProcedureGraph } from './graph';
import { finding, named, type LintFinding } from './lint-types';

/**
 * Formulas and temperature corrections read values measured earlier. A value is available at a
 * step only if it was measured on every path from the start that reaches the step: the
 * measuring step must dominate the step that uses it (see `dominators`).
 */

function measuredOnEveryPath(g: ProcedureGraph, dom: Dominators, source: number, user: number): boolean {
  return source !== user && dom.dominates(source, user);
}

function lintFormula(g: ProcedureGraph, dom: Dominators, step: FormulaStep, v: number): LintFinding[] {
  const parsed = parseFormula(step.expression);
  if (!parsed.ok) {
    return [finding('formula-invalid', 'error', [step.id], `The formula of ${named(step)} cannot be read: ${parsed.error.message}`)];
  }
  const out: LintFinding[] = [];
  const dummy: Record<string, FormulaValue> = {};
  for (const ref of parsed.references) {
    const r = g.index.get(ref);
    const source = r === undefined ? undefined : g.steps[r]!;
    if (!source || (source.kind !== 'reading' && source.kind !== 'formula')) {
      out.push(finding('formula-unknown-step', 'error', [step.id],
        `The formula of ${named(step)} uses "${ref}", which is not the id of a Reading or Formula step; use one of those ids.`));
      continue;
    }
    dummy[ref] = { value: 1, quantity: source.quantity };
    if (g.start >= 0 && dom.idom[v] !== -1 && !measuredOnEveryPath(g, dom, r!, v)) {
      out.push(finding('formula-unmeasured', 'error', [step.id, ref],
        `The formula of ${named(step)} uses ${named(source)}, but some paths reach the formula without that reading; measure it earlier on every path.`));
    }
  }
  if (out.length > 0) return out;
  const units = evaluateFormula(step.expression, dummy, { expect: step.quantity, parsed });
  if (!units.ok && units.error.code !== 'math') {
    const code = units.error.code === 'unit-mismatch' ? 'formula-units' : 'formula-invalid';
    out.push(finding(code, 'error', [step.id], `The formula of ${named(step)}: ${units.error.message}`));
  }
  return out;
}

function lintWinding(g: ProcedureGraph, dom: Dominators, step: ReadingStep, v: number): LintFinding[] {
  const ref = step.winding?.temperatureStep;
  if (ref === undefined) return [];
  const t = g.index.get(ref);
  const source = t === undefined ? undefined : g.steps[t]!;
  if (!source || source.kind !== 'reading' || source.quantity !== 'temperature') {
    return [finding('winding-invalid', 'error', [step.id],
      `${named(step)} corrects for temperature from "${ref}", which is not a temperature Reading; point it at the step that measures the engine temperature.`)];
  }
  if (g.start >= 0 && dom.idom[v] !== -1 && !measuredOnEveryPath(g, dom, t!, v)) {
    return [finding('winding-unmeasured', 'error', [step.id, ref],
      `${named(step)} needs the temperature from ${named(source)}, but some paths reach it without that reading; measure the temperature earlier on every path.`)];
  }
  return [];
}

/** Definite-measurement checks for every Formula and temperature-corrected Reading. */
export function lintDataflow(g: ProcedureGraph, dom: Dominators): LintFinding[] {
  const out: LintFinding[] = [];
  for (let v = 0; v < g.size; v++) {
    const step = g.steps[v]!;
    if (step.kind === 'formula') out.push(...lintFormula(g, dom, step, v));
    else if (step.kind === 'reading' && step.winding) out.push(...lintWinding(g, dom, step, v));
  }
  return out;
}
