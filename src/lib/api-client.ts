import { CSRF_HEADER } from '../../shared/schemas/auth';

/**
 * The one way the client talks to the API: JSON in and out, the session cookie sent along
 * ('same-origin'), and the CSRF token attached to every state-changing request. The token comes
 * from GET /api/csrf, is kept until the session changes (sign-in, sign-out, set-up, invite
 * accepted: call `resetCsrfToken()`), and is fetched again once if the server answers 403
 * `csrf_invalid` (e.g. after the server restarted or the session expired).
 */

/** An API error with the server's stable `code` (see server/errors.ts) and optional field details. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown;

  constructor(status: number, code: string, message: string, details?: unknown) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }

  /**
   * Field messages from a 400 `validation_failed`, keyed by the first path segment ("email").
   * Accepts the shapes a zod-backed server sends: a list of issues `{ path, message }` (what
   * server/middleware/error-handler.ts sends, path dotted or an array), zod's
   * `flatten()` (`{ fieldErrors }`), or a plain `{ field: message }` map.
   */
  fieldErrors(): Record<string, string> {
    return fieldErrorsFrom(this.details);
  }
}

function fieldErrorsFrom(details: unknown): Record<string, string> {
  const out: Record<string, string> = {};
  const put = (field: unknown, message: unknown) => {
    // The server sends dotted paths ("email", "belts.0.name"); a form field is the first segment.
    const key = Array.isArray(field) ? field[0] : typeof field === 'string' ? field.split('.')[0] : field;
    const text = Array.isArray(message) ? message[0] : message;
    if ((typeof key === 'string' || typeof key === 'number') && typeof text === 'string' && !(key in out)) {
      out[String(key)] = text;
    }
  };
  if (Array.isArray(details)) {
    for (const issue of details) {
      if (issue && typeof issue === 'object') {
        const { path, field, message } = issue as { path?: unknown; field?: unknown; message?: unknown };
        put(path ?? field, message);
      }
    }
    return out;
  }
  if (details && typeof details === 'object') {
    const record = details as Record<string, unknown>;
    if (Array.isArray(record.issues)) return fieldErrorsFrom(record.issues);
    if (Array.isArray(record.fields)) return fieldErrorsFrom(record.fields);
    const map = (record.fieldErrors ?? record.fields ?? record) as Record<string, unknown>;
    if (map && typeof map === 'object') {
      for (const [key, value] of Object.entries(map)) put(key, value);
    }
  }
  return out;
}

let csrfToken: string | null = null;
let csrfPending: Promise<string> | null = null;

/** Forget the CSRF token; the next state-changing request fetches a new one. */
export function resetCsrfToken(): void {
  csrfToken = null;
  csrfPending = null;
}

function toUrl(path: string): string {
  // Node's fetch (tests) needs an absolute URL; the browser resolves against the page either way.
  return typeof window === 'undefined' ? path : new URL(path, window.location.href).toString();
}

async function getCsrfToken(): Promise<string> {
  if (csrfToken) return csrfToken;
  csrfPending ??= send<{ token: string }>('GET', '/api/csrf').then((body) => {
    csrfToken = body.token;
    csrfPending = null;
    return body.token;
  }, (error: unknown) => {
    csrfPending = null;
    throw error;
  });
  return csrfPending;
}

/** The CSRF token for a request the helpers below cannot send (a multipart upload with progress). */
export function currentCsrfToken(): Promise<string> {
  return getCsrfToken();
}

/** The ApiError of a non-2xx answer whose body was read as text (used by XHR uploads). */
export function apiErrorFrom(status: number, statusText: string, text: string): ApiError {
  let parsed: { error?: { code?: unknown; message?: unknown; details?: unknown } } | undefined;
  try {
    parsed = text ? JSON.parse(text) : undefined;
  } catch {
    parsed = undefined;
  }
  const error = parsed?.error;
  return new ApiError(
    status,
    typeof error?.code === 'string' ? error.code : `http_${status}`,
    typeof error?.message === 'string' ? error.message : `The server answered ${status} ${statusText}.`.trim(),
    error?.details,
  );
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

interface RequestOptions {
  signal?: AbortSignal;
}

async function send<T>(method: Method, path: string, body?: unknown, options: RequestOptions = {}, csrf?: string): Promise<T> {
  const headers: Record<string, string> = { accept: 'application/json' };
  if (body !== undefined) headers['content-type'] = 'application/json';
  if (csrf) headers[CSRF_HEADER] = csrf;
  let response: Response;
  try {
    response = await fetch(toUrl(path), {
      method,
      headers,
      credentials: 'same-origin',
      body: body === undefined ? undefined : JSON.stringify(body),
      signal: options.signal,
    });
  } catch (error) {
    if (error instanceof Error && error.name === 'AbortError') throw error;
    throw new ApiError(0, 'network_error', 'The server did not answer. Check that Crankwise is running and try again.');
  }
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  let parsed: unknown = undefined;
  if (text) {
    try {
      parsed = JSON.parse(text);
    } catch {
      parsed = undefined;
    }
  }
  if (!response.ok) {
    const error = (parsed as { error?: { code?: unknown; message?: unknown; details?: unknown } } | undefined)?.error;
    throw new ApiError(
      response.status,
      typeof error?.code === 'string' ? error.code : `http_${response.status}`,
      typeof error?.message === 'string' ? error.message : `The server answered ${response.status} ${response.statusText}.`.trim(),
      error?.details,
    );
  }
  return parsed as T;
}

async function sendWithCsrf<T>(method: Method, path: string, body?: unknown, options?: RequestOptions): Promise<T> {
  try {
    return await send<T>(method, path, body, options, await getCsrfToken());
  } catch (error) {
    if (error instanceof ApiError && error.status === 403 && error.code === 'csrf_invalid') {
      resetCsrfToken();
      return send<T>(method, path, body, options, await getCsrfToken());
    }
    throw error;
  }
}

/** Typed helpers over fetch; every call resolves to the parsed JSON body (undefined for 204). */
export const api = {
  get: <T>(path: string, options?: RequestOptions) => send<T>('GET', path, undefined, options),
  post: <T>(path: string, body?: unknown, options?: RequestOptions) => sendWithCsrf<T>('POST', path, body ?? {}, options),
  patch: <T>(path: string, body: unknown, options?: RequestOptions) => sendWithCsrf<T>('PATCH', path, body, options),
  put: <T>(path: string, body: unknown, options?: RequestOptions) => sendWithCsrf<T>('PUT', path, body, options),
  delete: <T = void>(path: string, options?: RequestOptions) => sendWithCsrf<T>('DELETE', path, undefined, options),
};

/**
 * True when the error means "nobody is signed in" (session missing or expired), as opposed to
 * "signed in but not allowed" (403) or a wrong password on the sign-in form (401 `invalid_credentials`).
 */
export function isUnauthenticated(error: unknown): boolean {
  return error instanceof ApiError && error.status === 401 && error.code !== 'invalid_credentials';
}

/**
 * POSTs a multipart form (file uploads, e.g. a recording) with the session cookie and the CSRF
 * token; the browser sets the multipart boundary. Resolves to the parsed JSON body; throws ApiError
 * like the JSON helpers (and retries once on a stale CSRF token).
 */
export async function postForm<T>(path: string, form: FormData): Promise<T> {
  const attempt = async (): Promise<Response> => {
    try {
      return await fetch(toUrl(path), { method: 'POST', credentials: 'same-origin', headers: { accept: 'application/json', [CSRF_HEADER]: await getCsrfToken() }, body: form });
    } catch {
      throw new ApiError(0, 'network_error', 'The server did not answer. Check that Crankwise is running and try again.');
    }
  };
  let response = await attempt();
  let parsed = (await response.json().catch(() => undefined)) as { error?: { code?: string; message?: string; details?: unknown } } | undefined;
  if (response.status === 403 && parsed?.error?.code === 'csrf_invalid') {
    resetCsrfToken();
    response = await attempt();
    parsed = (await response.json().catch(() => undefined)) as typeof parsed;
  }
  if (!response.ok) {
    throw new ApiError(response.status, parsed?.error?.code ?? `http_${response.status}`, parsed?.error?.message ?? `The server answered ${response.status}.`, parsed?.error?.details);
  }
  return parsed as T;
}
