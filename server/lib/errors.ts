/** A failure that the client should see: an HTTP status, a stable code and a sentence that says what to do. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues?: { path: string; message: string }[],
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const notFound = (what: string) =>
  new AppError(404, 'not_found', `${what} was not found in this shop. Check the link, or pick it again from the list.`);
export const forbidden = (action = 'do this') =>
  new AppError(403, 'forbidden', `Your role in this shop does not allow you to ${action}. Ask a shop admin if you need it.`);
export const unauthenticated = () =>
  new AppError(401, 'unauthenticated', 'Please sign in to continue.');
export const badRequest = (message: string, issues?: { path: string; message: string }[]) =>
  new AppError(400, 'invalid_input', message, issues);
export const conflict = (message: string, extra?: Record<string, unknown>) =>
  new AppError(409, 'conflict', message, undefined, extra);
