import type { ProcedureDocument } from '../schema/procedure';
import { depthFirst, dominators } from './algorithms';
import { buildGraph } from './graph';
import { lintDataflow } from './lint-dataflow';
import { lintReachability, lintStructure, longestLoopFreePath } from './lint-graph';
import { lintLinks } from './lint-links';
import { lintStep } from './lint-steps';
import { finding, type LintFinding, type LintOptions } from './lint-types';

export interface LintReport {
  /** Errors first, then warnings; stable order within each. */
  readonly findings: readonly LintFinding[];
  readonly errorCount: number;
  readonly warningCount: number;
  /** True when publishing may go ahead (no errors). */
  readonly ok: boolean;
}

/**
 * The soundness check: runs live in the editor and again on publish (publish is refused while an
 * error stands). Near-linear in steps + branches.
 * Example: `lintProcedure(doc).findings` →
 * `[{ code: 'band-gap', severity: 'error', steps: ['coilPrimary'], message: 'The bands of ...' }]`.
 */
export function lintProcedure(doc: ProcedureDocument, options: LintOptions = {}): LintReport {
  const g = buildGraph(doc);
  const dfs = depthFirst(g, g.start);
  const all: LintFinding[] = [...lintStructure(g, doc.start), ...lintReachability(g, dfs)];
  for (const step of g.steps) lintStep(step, all);
  all.push(...lintDataflow(g, dominators(g, dfs)));
  if (options.links) all.push(...lintLinks(doc, options.links));
  const limit = options.longPathSteps ?? 40;
  const longest = longestLoopFreePath(g, dfs);
  if (longest > limit) {
    all.push(finding('long-path', 'warning', [doc.start],
      `The longest path runs ${longest} steps without repeating one (more than ${limit}); split the procedure or put the likely checks first.`));
  }
  const errors = all.filter((f) => f.severity === 'error');
  const warnings = all.filter((f) => f.severity === 'warning');
  return { findings: [...errors, ...warnings], errorCount: errors.length, warningCount: warnings.length, ok: errors.length === 0 };
}

export type { LintCode, LintFinding, LintOptions, LintSeverity } from './lint-types';
export type { LinkCatalogue, LinkTarget } from './lint-links';
