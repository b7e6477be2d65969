/**
 * The one way the client talks to the Rowpath API: same-origin JSON under /api, the session
 * cookie always sent, every failure turned into a typed ApiError with the contract's shape
 * `{ error: { code, message, details?: { fields? } } }`.
 */

export type FieldErrors = Record<string, string>;

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  /** Field name -> message, from a 400 "validation" body's details.fields. */
  readonly fields: FieldErrors;
  /** From the Retry-After header (seconds) on 429 answers; null otherwise. */
  readonly retryAfterSeconds: number | null;

  constructor(init: {
    status: number;
    code: string;
    message: string;
    fields?: FieldErrors;
    retryAfterSeconds?: number | null;
  }) {
    super(init.message);
    this.name = 'ApiError';
    this.status = init.status;
    this.code = init.code;
    this.fields = init.fields ?? {};
    this.retryAfterSeconds = init.retryAfterSeconds ?? null;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
type QueryValue = string | number | boolean | null | undefined;

export interface RequestOptions {
  method?: Method;
  body?: unknown;
  query?: Record<string, QueryValue>;
  signal?: AbortSignal;
}

// --- CSRF -------------------------------------------------------------------------------------
// The token lives in memory only. It changes on sign-in and sign-out, so both call
// forgetCsrfToken(); the next state-changing request fetches a fresh one.

let csrfToken: string | null = null;
let csrfInFlight: Promise<string> | null = null;

export function forgetCsrfToken(): void {
  csrfToken = null;
  csrfInFlight = null;
}

async function getCsrfToken(): Promise<string> {
  if (csrfToken) return csrfToken;
  if (!csrfInFlight) {
    const request = send<{ token: string }>('/api/auth/csrf', { method: 'GET' }, null).then(
      ({ token }) => {
        csrfToken = token;
        return token;
      },
    );
    // A failed fetch must not stick: the next request tries again.
    csrfInFlight = request.finally(() => {
      csrfInFlight = null;
    });
  }
  return csrfInFlight;
}

// --- Requests ---------------------------------------------------------------------------------

export function buildQueryString(query: Record<string, QueryValue> | undefined): string {
  if (!query) return '';
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value === undefined || value === null || value === '') continue;
    params.set(key, String(value));
  }
  const text = params.toString();
  return text ? `?${text}` : '';
}

const fallbackMessages: Record<number, string> = {
  0: 'Rowpath could not reach the server. Check the connection and try again.',
  401: 'Your session has ended. Sign in again.',
  403: 'Your role does not give access to this.',
  404: 'That was not found, or it is outside what you can see.',
  429: 'Too many attempts. Wait a moment and try again.',
};

function parseRetryAfterSeconds(header: string | null): number | null {
  if (!header) return null;
  const seconds = Number(header);
  if (Number.isFinite(seconds)) return Math.max(0, Math.ceil(seconds));
  const date = Date.parse(header);
  if (Number.isNaN(date)) return null;
  return Math.max(0, Math.ceil((date - Date.now()) / 1000));
}

async function toApiError(response: Response): Promise<ApiError> {
  let code = `http_${response.status}`;
  let message = fallbackMessages[response.status] ?? 'Something went wrong on the server. Try again.';
  let fields: FieldErrors | undefined;
  try {
    const body = (await response.json()) as {
      error?: { code?: unknown; message?: unknown; details?: { fields?: unknown } };
    };
    const error = body?.error;
    if (error && typeof error === 'object') {
      if (typeof error.code === 'string') code = error.code;
      if (typeof error.message === 'string' && error.message) message = error.message;
      const rawFields = error.details?.fields;
      if (rawFields && typeof rawFields === 'object') {
        fields = Object.fromEntries(
          Object.entries(rawFields as Record<string, unknown>).map(([k, v]) => [k, String(v)]),
        );
      }
    }
  } catch {
    // Not JSON (a proxy page, an empty body): keep the fallback message.
  }
  return new ApiError({
    status: response.status,
    code,
    message,
    fields,
    retryAfterSeconds: parseRetryAfterSeconds(response.headers.get('Retry-After')),
  });
}

async function send<T>(path: string, options: RequestOptions, csrf: string | null): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';
  if (csrf) headers['X-CSRF-Token'] = csrf;

  let response: Response;
  try {
    response = await fetch(`${path}${buildQueryString(options.query)}`, {
      method: options.method ?? 'GET',
      credentials: 'include',
      headers,
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      signal: options.signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError({ status: 0, code: 'network', message: fallbackMessages[0] });
  }

  if (!response.ok) throw await toApiError(response);
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  return (text ? JSON.parse(text) : undefined) as T;
}

/** Sends one request; state-changing methods carry the CSRF token and retry once if it went stale. */
export async function apiRequest<T>(path: string, options: RequestOptions = {}): Promise<T> {
  const method = options.method ?? 'GET';
  if (method === 'GET') return send<T>(path, options, null);

  try {
    return await send<T>(path, options, await getCsrfToken());
  } catch (error) {
    if (isApiError(error) && error.status === 403 && error.code === 'csrf') {
      forgetCsrfToken();
      return send<T>(path, options, await getCsrfToken());
    }
    throw error;
  }
}

export const api = {
  get: <T>(path: string, query?: RequestOptions['query'], signal?: AbortSignal) =>
    apiRequest<T>(path, { method: 'GET', query, signal }),
  post: <T>(path: string, body?: unknown) => apiRequest<T>(path, { method: 'POST', body }),
  put: <T>(path: string, body?: unknown) => apiRequest<T>(path, { method: 'PUT', body }),
  patch: <T>(path: string, body?: unknown) => apiRequest<T>(path, { method: 'PATCH', body }),
  delete: <T>(path: string) => apiRequest<T>(path, { method: 'DELETE' }),
};
