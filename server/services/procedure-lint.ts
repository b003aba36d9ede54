import { lintProcedure, type LintFinding } from '@shared/engine';
import type { LinkCatalogue } from '@shared/engine/lint';
import type { ProcedureDocument } from '@shared/schema';

/** The shared soundness check; the server runs it on every save and again on publish. */
export function lintDocument(doc: ProcedureDocument, links?: LinkCatalogue): { findings: LintFinding[]; errors: number; warnings: number } {
  const report = lintProcedure(doc, links ? { links } : {});
  return { findings: [...report.findings], errors: report.errorCount, warnings: report.warningCount };
}
