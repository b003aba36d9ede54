import type { Request } from 'express';
import { notFound } from './errors';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A route's id parameter; anything that is not a UUID cannot exist, so it is a 404 like a foreign id. */
export function idParam(req: Request, name = 'id', what = 'That record'): string {
  const raw = req.params[name];
  if (typeof raw !== 'string' || !UUID.test(raw)) throw notFound(what);
  return raw.toLowerCase();
}
