import type { z } from 'zod';
import { AppError } from './errors';

/** Parses input with a shared schema; a failure becomes one 400 with an issue per field. */
export function parseInput<S extends z.ZodType>(schema: S, input: unknown, what = 'The request'): z.infer<S> {
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const issues = result.error.issues.map((i) => ({ path: i.path.map(String).join('.'), message: i.message }));
  throw new AppError(400, 'invalid_input', `${what} has ${issues.length === 1 ? 'a problem' : `${issues.length} problems`}: fix the marked fields and send it again.`, issues);
}
