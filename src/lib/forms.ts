import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from './api-client';

/**
 * Puts the server's field issues onto the form's fields; returns the message for the form as
 * a whole (what did not map onto a field, or the envelope's sentence).
 */
export function applyServerIssues<T extends FieldValues>(err: unknown, setError: UseFormSetError<T>, fields: readonly string[]): string {
  if (!(err instanceof ApiError)) return 'Something went wrong. Try again.';
  let unmapped = false;
  for (const issue of err.issues) {
    const top = issue.path.split('.')[0] ?? '';
    if (fields.includes(top)) setError(issue.path as Path<T>, { type: 'server', message: issue.message });
    else unmapped = true;
  }
  return err.issues.length === 0 || unmapped ? err.message : '';
}
