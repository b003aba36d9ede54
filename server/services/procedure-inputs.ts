import { z } from 'zod';
import { procedureDocumentSchema, procedureMetaSchema } from '@shared/schema';

// Request bodies of the Drafting API. The document itself is the shared procedure schema;
// these only wrap it with what the server needs (lock versions, filters, comments).

export const procedureListQuery = z.object({
  q: z.string().trim().max(120).optional(),
  status: z.enum(['any', 'draft', 'in_review', 'published', 'unpublished']).default('any'),
  archived: z.enum(['0', '1']).default('0'),
});
export type ProcedureListQuery = z.infer<typeof procedureListQuery>;

export const createProcedureBody = z.object({ meta: procedureMetaSchema });
export type CreateProcedureBody = z.infer<typeof createProcedureBody>;

export const duplicateProcedureBody = z.object({ title: z.string().trim().min(1).max(120).optional() });

export const archiveProcedureBody = z.object({ archived: z.boolean() });

export const saveDraftBody = z.object({
  document: procedureDocumentSchema,
  /** The lock version the author's copy was loaded at; a stale one answers 409. */
  lockVersion: z.number().int().min(1),
});
export type SaveDraftBody = z.infer<typeof saveDraftBody>;

export const newDraftBody = z.object({ fromVersionId: z.uuid().optional() });

export const reviewDecisionBody = z.object({ comment: z.string().trim().max(4000).optional() });

export const commentBody = z.object({
  body: z.string().trim().min(1, 'Write the comment first').max(4000),
  stepId: z.string().max(64).optional(),
});

/** An import: the file's parsed JSON; the server validates and upgrades it itself. */
export const importBody = z.object({ file: z.unknown(), title: z.string().trim().min(1).max(120).optional() });
