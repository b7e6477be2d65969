import { ApiError, api } from '@/lib/api';

/*
 * The shell's api client sends JSON only. Uploads (multipart) and CSV imports (text/csv) need
 * their own body, so they go through this small sender: same cookie, same CSRF header, and
 * failures as the same typed ApiError (plus the error's raw details, e.g. an import's line list).
 */

export class DetailedApiError extends ApiError {
  readonly details: Record<string, unknown>;
  constructor(init: ConstructorParameters<typeof ApiError>[0] & { details?: Record<string, unknown> }) {
    super(init);
    this.details = init.details ?? {};
  }
}

async function csrfToken(): Promise<string> {
  return (await api.get<{ token: string }>('/api/auth/csrf')).token;
}

const fallback: Record<number, string> = {
  0: 'Rowpath could not reach the server. Check the connection and try again.',
  413: 'The file is too large.',
  415: 'That kind of file cannot be sent here.',
};

async function toError(response: Response): Promise<DetailedApiError> {
  let body: { error?: { code?: string; message?: string; details?: Record<string, unknown> } } = {};
  try {
    body = await response.json();
  } catch {
    // A proxy's page or an empty body: keep the fallback message.
  }
  const details = body.error?.details ?? {};
  const rawFields = (details.fields ?? {}) as Record<string, unknown>;
  return new DetailedApiError({
    status: response.status,
    code: body.error?.code ?? `http_${response.status}`,
    message: body.error?.message || fallback[response.status] || 'Something went wrong on the server. Try again.',
    fields: Object.fromEntries(Object.entries(rawFields).map(([k, v]) => [k, String(v)])),
    details,
  });
}

/** POSTs a FormData or text body; the token is fetched per call (uploads are rare, and it survives a sign-in). */
export async function postRaw<T>(path: string, body: FormData | Blob | string, contentType?: string): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json', 'X-CSRF-Token': await csrfToken() };
  if (contentType) headers['Content-Type'] = contentType;
  let response: Response;
  try {
    response = await fetch(path, { method: 'POST', credentials: 'include', headers, body });
  } catch {
    throw new DetailedApiError({ status: 0, code: 'network', message: fallback[0] });
  }
  if (!response.ok) throw await toError(response);
  return (await response.json()) as T;
}
