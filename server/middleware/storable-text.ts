import type { RequestHandler } from 'express';
import { AppError } from '../lib/errors';

// PostgreSQL stores neither a NUL character (in text or jsonb) nor, in jsonb, a lone UTF-16
// surrogate; left to the database either would be a 500. No form sends them, so they are refused
// at the door, with the field named.
// eslint-disable-next-line no-control-regex -- the NUL character is exactly what this looks for
const UNSTORABLE = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** The path of the first string (value or key) PostgreSQL could not store, or null. Iterative: any depth. */
export function unstorableText(value: unknown): string | null {
  const stack: [unknown, string][] = [[value, '']];
  while (stack.length) {
    const [v, path] = stack.pop()!;
    if (typeof v === 'string') {
      if (UNSTORABLE.test(v)) return path || '(body)';
    } else if (v && typeof v === 'object') {
      for (const [k, child] of Object.entries(v)) {
        const at = path ? `${path}.${k}` : k;
        if (UNSTORABLE.test(k)) return at;
        stack.push([child, at]);
      }
    }
  }
  return null;
}

export function assertStorableText(value: unknown, what = 'The request'): void {
  const path = unstorableText(value);
  if (path !== null) {
    throw new AppError(400, 'invalid_text', `${what} contains a character that cannot be stored (a NUL byte or a broken Unicode character). Remove it and send again.`,
      [{ path, message: 'Remove the NUL or broken character' }]);
  }
}

/** Refuses a JSON body or query string with text PostgreSQL cannot store. */
export const storableText: RequestHandler = (req, _res, next) => {
  assertStorableText(req.query, 'The address');
  assertStorableText(req.body);
  next();
};
