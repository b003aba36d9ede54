import { z } from 'zod';
import { procedureDocumentSchema } from './procedure';
import { quantitySchema } from './procedure';

/** Body of `POST /api/procedures/lint`. */
export const lintProcedureBodySchema = z.object({ document: procedureDocumentSchema });
export type LintProcedureBody = z.infer<typeof lintProcedureBodySchema>;

/** Body of `POST /api/readings/parse`: what was typed, the quantity, and the step's display unit. */
export const parseReadingBodySchema = z.object({
  text: z.string().max(64, 'A reading is at most 64 characters'),
  quantity: quantitySchema,
  unit: z.string().max(8).optional(),
});
export type ParseReadingBody = z.infer<typeof parseReadingBodySchema>;
