import { randomUUID } from 'node:crypto';
import { z } from 'zod';
import type { ShopContext } from '../auth/context';
import type { AppDeps } from '../deps';
import { AppError } from '../lib/errors';
import { issuesFromZod, upgradeProcedure, type ProcedureDocument } from '@shared/schema';
import { findProcedure, findVersion } from './procedure-common';
import { createProcedure } from './procedure.service';
import { MAX_PHOTO_BYTES } from './image-check';
import { forgetPictures, pictureRefs, picturesByIds, preparePicture, storePictures, type PreparedPicture } from './step-picture.service';

/** The file format is the shared document itself (docs/procedure-format.md), wrapped with a marker and its pictures. */
export const EXPORT_FORMAT = 'sparkwright-procedure';
/** The largest procedure file import reads: pictures travel inside it as base64 (a third larger than their bytes). */
export const IMPORT_BODY_LIMIT = '64mb';
const MAX_FILE_PICTURES = 200;

/** One picture in the file: the original bytes as uploaded, base64; the thumbnail and phone rendition are made again on import. */
export interface FilePicture { id: string; contentType: string; name: string; data: string }

export interface ExportFile {
  format: typeof EXPORT_FORMAT;
  exportedAt: string;
  source: { procedure: string; version: number | null; status: string };
  document: ProcedureDocument;
  pictures: FilePicture[];
}

export async function exportVersion(deps: AppDeps, ctx: ShopContext, ids: { procedureId: string; versionId: string }): Promise<{ file: ExportFile; filename: string }> {
  const p = await findProcedure(ctx, ids.procedureId);
  const v = await findVersion(ctx, p.id, ids.versionId);
  const up = upgradeProcedure(v.document);
  if (!up.ok) throw new AppError(500, 'stored_document_invalid', 'This version cannot be read; tell the engineers its id.');
  const rows = await picturesByIds(deps, ctx, pictureRefs(up.document).map((r) => r.id));
  const pictures: FilePicture[] = [];
  for (const row of rows) {
    const { body } = await deps.store.get(row.object_key);
    pictures.push({ id: row.id, contentType: row.content_type, name: row.original_name, data: body.toString('base64') });
  }
  const file: ExportFile = {
    format: EXPORT_FORMAT, exportedAt: new Date().toISOString(),
    source: { procedure: p.slug, version: v.number, status: v.status }, document: up.document, pictures,
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

const invalid = (message: string, issues?: { path: string; message: string }[]) =>
  new AppError(422, 'import_invalid', `The file cannot be imported: ${message} Nothing was stored; fix the listed problems and import it again.`, issues);

const filePicturesSchema = z.array(z.object({
  id: z.string().uuid(),
  contentType: z.string().max(100),
  name: z.string().max(200).default('picture'),
  // base64 of at most MAX_PHOTO_BYTES
  data: z.string().max(Math.ceil(MAX_PHOTO_BYTES / 3) * 4 + 4).regex(/^[A-Za-z0-9+/]*={0,2}$/, 'Not base64 text'),
})).max(MAX_FILE_PICTURES);

/**
 * Reads the file's pictures that the document names, checks each one by its bytes like an upload,
 * and gives each a new id (a shop may import the same file twice); the document is rewritten to match.
 */
async function readFilePictures(raw: unknown, doc: ProcedureDocument): Promise<{ document: ProcedureDocument; pictures: { id: string; picture: PreparedPicture }[] }> {
  const refs = pictureRefs(doc);
  if (refs.length === 0) return { document: doc, pictures: [] };
  const parsed = filePicturesSchema.safeParse((raw as { pictures?: unknown }).pictures ?? []);
  if (!parsed.success) throw invalid('its pictures are not readable.', issuesFromZod(parsed.error.issues).map((i) => ({ path: `pictures.${i.path}`, message: i.message })));
  const inFile = new Map(parsed.data.map((p, i) => [p.id, { ...p, index: i }]));
  const missing = refs.filter((r) => !inFile.has(r.id));
  if (missing.length > 0) {
    throw invalid('a step names a picture the file does not carry.', missing.map((m) => ({ path: stepPath(doc, `steps.${m.stepIndex}.pictures.${m.index}`), message: `The file has no picture ${m.id}` })));
  }
  const newIds = new Map<string, string>();
  const pictures: { id: string; picture: PreparedPicture }[] = [];
  for (const oldId of new Set(refs.map((r) => r.id))) {
    const p = inFile.get(oldId)!;
    try {
      pictures.push({ id: randomUUID(), picture: await preparePicture(Buffer.from(p.data, 'base64'), p.name.replace(/[\\/]/g, '_').replaceAll('..', '_') || 'picture') });
    } catch (e) {
      throw invalid('one of its pictures was refused.', [{ path: `pictures.${p.index}`, message: e instanceof Error ? e.message : 'Not a picture' }]);
    }
    newIds.set(oldId, pictures.at(-1)!.id);
  }
  const steps = doc.steps.map((s) => (s.pictures ? { ...s, pictures: s.pictures.map((p) => ({ ...p, id: newIds.get(p.id)! })) } : s));
  return { document: { ...doc, steps }, pictures };
}

/**
 * Validates an exported file (or a bare document), upgrading older schema versions, and
 * creates a new procedure with it as the draft, with its pictures, all in one transaction. Any
 * problem is a 422 with one issue per field and nothing stored (no row, no object).
 */
export async function importProcedure(deps: AppDeps, ctx: ShopContext, input: { file: unknown; title?: string | undefined }): Promise<{ procedureId: string; draftId: string; upgradedFrom: number; pictures: number }> {
  const raw = isWrapped(input.file) ? input.file.document : input.file;
  const up = upgradeProcedure(raw);
  if (!up.ok) {
    const issues = up.error ? issuesFromZod(up.error.issues).map((i) => ({ path: stepPath(raw, i.path), message: i.message })) : undefined;
    throw invalid(up.message, issues);
  }
  const ids = new Set<string>();
  const dupes = up.document.steps.filter((s) => (ids.has(s.id) ? true : (ids.add(s.id), false)));
  if (dupes.length > 0) {
    throw invalid('two steps share an id.', dupes.map((s) => ({ path: `steps (${s.id})`, message: `The id "${s.id}" is used more than once; give each step its own id.` })));
  }
  const { document, pictures } = await readFilePictures(isWrapped(input.file) ? input.file : {}, up.document);
  const meta = { ...document.meta, ...(input.title ? { title: input.title } : {}) };
  const stepOf = new Map(document.steps.flatMap((s) => (s.pictures ?? []).map((p) => [p.id, s.id] as const)));
  const withSteps = pictures.map((p) => ({ ...p, stepId: stepOf.get(p.id)! }));
  let stored = false;
  const created = await createProcedure(deps, ctx, {
    meta, document: { ...document, meta }, action: 'procedure.imported',
    // rows in the procedure's own transaction; if anything after fails, the objects go again
    alsoStore: async (p, t) => {
      await storePictures(deps, { shopId: ctx.shopId, procedureId: p.procedureId, versionId: p.draftId, userId: ctx.userId }, withSteps, t);
      stored = true;
    },
  }).catch(async (e: unknown) => {
    if (stored) await forgetPictures(deps, ctx.shopId, pictures);
    throw e;
  });
  return { ...created, upgradedFrom: up.upgradedFrom, pictures: pictures.length };
}

function isWrapped(file: unknown): file is { format: string; document: unknown; pictures?: unknown } {
  return typeof file === 'object' && file !== null && (file as { format?: unknown }).format === EXPORT_FORMAT && 'document' in file;
}
