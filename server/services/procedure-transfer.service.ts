import type { ShopContext } from '../auth/context';
import type { AppDeps } from '../deps';
import { AppError } from '../lib/errors';
import { issuesFromZod, upgradeProcedure, type ProcedureDocument } from '@shared/schema';
import { findProcedure, findVersion } from './procedure-common';
import { createProcedure } from './procedure.service';

/** The file format is the shared document itself (docs/procedure-format.md), wrapped with a marker. */
export const EXPORT_FORMAT = 'sparkwright-procedure';

export interface ExportFile {
  format: typeof EXPORT_FORMAT;
  exportedAt: string;
  source: { procedure: string; version: number | null; status: string };
  document: ProcedureDocument;
}

export async function exportVersion(ctx: ShopContext, ids: { procedureId: string; versionId: string }): Promise<{ file: ExportFile; filename: string }> {
  const p = await findProcedure(ctx, ids.procedureId);
  const v = await findVersion(ctx, p.id, ids.versionId);
  const up = upgradeProcedure(v.document);
  if (!up.ok) throw new AppError(500, 'stored_document_invalid', 'This version cannot be read; tell the engineers its id.');
  const file: ExportFile = {
    format: EXPORT_FORMAT, exportedAt: new Date().toISOString(),
    source: { procedure: p.slug, version: v.number, status: v.status }, document: up.document,
  };
  return { file, filename: `${p.slug}-${v.number === null ? 'draft' : `v${v.number}`}.json` };
}

/** Names the step an issue path points into, so the report reads step by step. */
function stepPath(raw: unknown, path: string): string {
  const m = /^steps\.(\d+)(.*)$/.exec(path);
  if (!m) return path;
  const steps = (raw as { steps?: { id?: unknown }[] }).steps;
  const id = steps?.[Number(m[1])]?.id;
  return typeof id === 'string' ? `steps.${m[1]} (${id})${m[2]}` : path;
}

/**
 * Validates an exported file (or a bare document), upgrading older schema versions, and
 * creates a new procedure with it as the draft, all in one transaction. Any problem is a 422
 * with one issue per field and nothing stored.
 */
export async function importProcedure(deps: AppDeps, ctx: ShopContext, input: { file: unknown; title?: string | undefined }): Promise<{ procedureId: string; draftId: string; upgradedFrom: number }> {
  const raw = isWrapped(input.file) ? input.file.document : input.file;
  const up = upgradeProcedure(raw);
  if (!up.ok) {
    const issues = up.error ? issuesFromZod(up.error.issues).map((i) => ({ path: stepPath(raw, i.path), message: i.message })) : undefined;
    throw new AppError(422, 'import_invalid', `The file cannot be imported: ${up.message} Nothing was stored; fix the listed problems and import it again.`, issues);
  }
  const ids = new Set<string>();
  const dupes = up.document.steps.filter((s) => (ids.has(s.id) ? true : (ids.add(s.id), false)));
  if (dupes.length > 0) {
    throw new AppError(422, 'import_invalid', 'The file cannot be imported: two steps share an id. Nothing was stored.',
      dupes.map((s) => ({ path: `steps (${s.id})`, message: `The id "${s.id}" is used more than once; give each step its own id.` })));
  }
  const meta = { ...up.document.meta, ...(input.title ? { title: input.title } : {}) };
  const created = await createProcedure(deps, ctx, { meta, document: { ...up.document, meta }, action: 'procedure.imported' });
  return { ...created, upgradedFrom: up.upgradedFrom };
}

function isWrapped(file: unknown): file is { format: string; document: unknown } {
  return typeof file === 'object' && file !== null && (file as { format?: unknown }).format === EXPORT_FORMAT && 'document' in file;
}
