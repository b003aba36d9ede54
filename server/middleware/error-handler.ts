import type { ErrorRequestHandler, RequestHandler } from 'express';
import { AppError } from '../lib/errors';

interface HttpishError { status?: number; statusCode?: number; type?: string; code?: string; expose?: boolean }

/** Seconds a client is told to wait when the database is out (the phone's outbox retries sooner anyway). */
export const RETRY_AFTER_SECONDS = 5;

// PostgreSQL's own codes for "not now": shutting down, starting up, too many connections,
// connection failures (class 08), a statement cancelled by its timeout.
const PG_UNAVAILABLE = new Set(['57P01', '57P02', '57P03', '53300', '08000', '08001', '08003', '08004', '08006', '57014']);
// (a refused or dropped socket may also be the object store's: the words below cover both)
const NET_UNAVAILABLE = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENETUNREACH']);
// What node-postgres and Sequelize's pool say when a connection ends, cannot open or cannot be had in time.
const UNAVAILABLE_MESSAGE = /Connection terminated|not queryable|timeout exceeded when trying to connect|timeout expired|Query read timeout|Connection timed out/i;
const SEQUELIZE_UNAVAILABLE = new Set([
  'SequelizeConnectionError', 'SequelizeConnectionRefusedError', 'SequelizeConnectionTimedOutError',
  'SequelizeConnectionAcquireTimeoutError', 'SequelizeHostNotReachableError', 'SequelizeHostNotFoundError',
]);

/** True when the error means the database cannot be reached just now (Sequelize wraps pg's error in `parent`). */
function databaseUnavailable(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== 'object' || depth > 3) return false;
  const e = err as { name?: string; code?: string; message?: string; parent?: unknown; original?: unknown; cause?: unknown };
  if (e.name && SEQUELIZE_UNAVAILABLE.has(e.name)) return true;
  if (e.code && (PG_UNAVAILABLE.has(e.code) || NET_UNAVAILABLE.has(e.code))) return true;
  if (typeof e.message === 'string' && UNAVAILABLE_MESSAGE.test(e.message)) return true;
  return [e.parent, e.original, e.cause].some((inner) => inner !== err && databaseUnavailable(inner, depth + 1));
}

/** Maps errors thrown by body parsers, CSRF, multer and services onto one envelope. */
function toAppError(err: unknown): AppError {
  if (err instanceof AppError) return err;
  const e = err as HttpishError & Error;
  if (e?.type === 'entity.parse.failed') {
    return new AppError(400, 'invalid_json', 'The request body is not valid JSON. Send a JSON object.');
  }
  if (e?.type === 'entity.too.large') {
    return new AppError(413, 'too_large', 'The request is too large. Send a smaller document or file.');
  }
  if (e?.code === 'EBADCSRFTOKEN' || (e?.message === 'invalid csrf token')) {
    return new AppError(403, 'csrf', 'The form has expired or was sent without its security token. Reload the page and try again.');
  }
  if (e?.name === 'MulterError') {
    const tooBig = e.code === 'LIMIT_FILE_SIZE';
    return new AppError(tooBig ? 413 : 400, tooBig ? 'too_large' : 'invalid_upload',
      tooBig ? 'That file is too large. Photos up to 8 MB are accepted; take it again at a lower resolution.' : 'The upload could not be read. Attach one photo and try again.');
  }
  if (databaseUnavailable(err)) {
    return new AppError(503, 'unavailable', `Sparkwright cannot reach its database or photo store just now. Try again in ${RETRY_AFTER_SECONDS} seconds; the Bench keeps unsent answers on the phone and sends them by itself.`);
  }
  const status = e?.status ?? e?.statusCode;
  if (status && status >= 400 && status < 500) {
    return new AppError(status, 'bad_request', 'The request could not be understood. Check what was sent and try again.');
  }
  return new AppError(500, 'internal', 'Something went wrong on our side. Try again; if it keeps happening, give your admin the request id.');
}

export function errorHandler(log: (msg: string, err: unknown) => void): ErrorRequestHandler {
  return (err, req, res, _next) => {
    const appErr = toAppError(err);
    // an outage answers every request with 503: one line each, not a stack trace each
    if (appErr.status === 503) log(`request ${req.requestId} ${req.method} ${req.originalUrl}: unavailable (${(err as Error)?.message})`, undefined);
    else if (appErr.status >= 500) log(`request ${req.requestId} ${req.method} ${req.originalUrl} failed`, err);
    if (res.headersSent) return;
    if (appErr.status === 503) res.setHeader('Retry-After', String(RETRY_AFTER_SECONDS));
    res.status(appErr.status).json({
      error: {
        code: appErr.code,
        message: appErr.message,
        ...(appErr.issues ? { issues: appErr.issues } : {}),
        ...(appErr.extra ?? {}),
        requestId: req.requestId,
      },
    });
  };
}

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError(404, 'not_found', `There is no API route ${req.method} ${req.path}. Check the address.`));
};
