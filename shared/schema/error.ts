import { z } from 'zod';

/** One problem with one input field; `path` is dotted (`steps.3.bands.0.next`). */
export const errorIssueSchema = z.object({ path: z.string(), message: z.string() });
export type ErrorIssue = z.infer<typeof errorIssueSchema>;

/** The one error body every API error uses: `{ error: { code, message, issues?, requestId } }`. */
export const errorEnvelopeSchema = z.object({
  error: z.object({
    code: z.string().min(1),
    message: z.string().min(1),
    issues: z.array(errorIssueSchema).optional(),
    requestId: z.string(),
  }),
});
export type ErrorEnvelope = z.infer<typeof errorEnvelopeSchema>;

/**
 * Turns zod issues into envelope issues. Example: `issuesFromZod(result.error.issues)` →
 * `[{ path: 'steps.0.unit', message: '"ohm" is not a unit for resistance; ...' }]`.
 */
export function issuesFromZod(issues: ReadonlyArray<{ path: ReadonlyArray<PropertyKey>; message: string }>): ErrorIssue[] {
  return issues.map((i) => ({ path: i.path.map(String).join('.'), message: i.message }));
}
