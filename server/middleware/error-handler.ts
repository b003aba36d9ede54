import type { ErrorRequestHandler, RequestHandler } from 'express';
import { AppError } from '../lib/errors';

interface HttpishError { status?: number; statusCode?: number; type?: string; code?: string; expose?: boolean }

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
  const status = e?.status ?? e?.statusCode;
  if (status && status >= 400 && status < 500) {
    return new AppError(status, 'bad_request', 'The request could not be understood. Check what was sent and try again.');
  }
  return new AppError(500, 'internal', 'Something went wrong on our side. Try again; if it keeps happening, give your admin the request id.');
}

export function errorHandler(log: (msg: string, err: unknown) => void): ErrorRequestHandler {
  return (err, req, res, _next) => {
    const appErr = toAppError(err);
    if (appErr.status >= 500) log(`request ${req.requestId} ${req.method} ${req.originalUrl} failed`, err);
    if (res.headersSent) return;
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
