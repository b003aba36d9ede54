import type { ErrorIssue } from '@shared/schema/error';

/** An API failure, carrying the server's envelope: code, message, field issues and request id. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues: ErrorIssue[] = [],
    readonly requestId = '',
    readonly body: Record<string, unknown> = {},
  ) {
    super(message);
  }
  /** true when the request never reached the server (offline, DNS, aborted) */
  get isNetwork(): boolean {
    return this.status === 0;
  }
}

let csrfToken: string | null = null;

/** The auth feature hands over the token that sign-in returns (the session was regenerated). */
export function setCsrfToken(token: string | null): void {
  csrfToken = token;
}

const offline = () => new ApiError(0, 'network', 'No connection to the server. Your work is kept on this device.');

async function fetchCsrf(): Promise<string> {
  const res = await fetch('/api/auth/csrf', { credentials: 'same-origin' }).catch(() => { throw offline(); });
  if (!res.ok) throw await toApiError(res);
  csrfToken = ((await res.json()) as { token: string }).token;
  return csrfToken;
}

async function toApiError(res: Response): Promise<ApiError> {
  try {
    const body = (await res.json()) as { error?: { code: string; message: string; issues?: ErrorIssue[]; requestId?: string } };
    if (body.error) {
      const { requestId = '' } = body.error;
      // a 500 asks the person to quote the request id: the message they see carries it
      const message = res.status >= 500 && requestId ? `${body.error.message} Request id: ${requestId}.` : body.error.message;
      return new ApiError(res.status, body.error.code, message, body.error.issues ?? [], requestId, body.error as Record<string, unknown>);
    }
  } catch {
    // not JSON: fall through
  }
  return new ApiError(res.status, 'http_error', `The server answered ${res.status}. Try again in a moment.`);
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

async function send<T>(method: Method, url: string, body?: unknown, retried = false): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  const isForm = typeof FormData !== 'undefined' && body instanceof FormData;
  if (body !== undefined && !isForm) headers['Content-Type'] = 'application/json';
  if (method !== 'GET') headers['X-CSRF-Token'] = csrfToken ?? (await fetchCsrf());
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      headers,
      credentials: 'same-origin',
      body: body === undefined ? undefined : isForm ? (body as FormData) : JSON.stringify(body),
    });
  } catch {
    throw offline();
  }
  if (res.status === 403 && method !== 'GET' && !retried) {
    const err = await toApiError(res.clone());
    if (err.code === 'csrf') {
      await fetchCsrf();
      return send<T>(method, url, body, true);
    }
  }
  if (!res.ok) throw await toApiError(res);
  if (res.status === 204) return undefined as T;
  const type = res.headers.get('Content-Type') ?? '';
  return (type.includes('application/json') ? await res.json() : await res.text()) as T;
}

/** The one HTTP client of the app: JSON in and out, CSRF handled, errors as ApiError. No UI here. */
export const api = {
  get: <T>(url: string) => send<T>('GET', url),
  post: <T>(url: string, body?: unknown) => send<T>('POST', url, body ?? {}),
  put: <T>(url: string, body?: unknown) => send<T>('PUT', url, body ?? {}),
  patch: <T>(url: string, body?: unknown) => send<T>('PATCH', url, body ?? {}),
  delete: <T = void>(url: string) => send<T>('DELETE', url),
  upload: <T>(url: string, form: FormData) => send<T>('POST', url, form),
};

/** Builds a query string from defined values. Example: qs({ q: 'wren', page: 2 }) === '?q=wren&page=2' */
export function qs(params: Record<string, string | number | boolean | undefined | null>): string {
  const p = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== null && v !== '') p.set(k, String(v));
  const s = p.toString();
  return s ? `?${s}` : '';
}
