/**
 * The one fetch wrapper of the client: JSON in and out, the session cookie (same origin), the CSRF
 * header on state-changing requests, and the server's error shape `{ error: { code, message,
 * field? } }` turned into a thrown ApiError.
 */
import { CSRF_HEADER } from '@shared/api/session';

/** An error answer of the API. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly field?: string,
  ) {
    super(message);
  }
}

let csrfToken: string | undefined;

/** Remembers the session's CSRF token (from GET/POST/DELETE /api/session answers). */
export function setCsrfToken(token: string | undefined): void {
  csrfToken = token;
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

async function refreshCsrfToken(): Promise<void> {
  const res = await fetch('/api/session', { credentials: 'same-origin', headers: { accept: 'application/json' } });
  if (res.ok) setCsrfToken(((await res.json()) as { csrfToken: string }).csrfToken);
}

async function send<T>(method: Method, path: string, body?: unknown, retried = false): Promise<T> {
  const headers: Record<string, string> = { accept: 'application/json' };
  const form = body instanceof FormData;
  // A form's content type (multipart, with its boundary) is the browser's to write.
  if (body !== undefined && !form) headers['content-type'] = 'application/json';
  if (method !== 'GET') {
    if (!csrfToken) await refreshCsrfToken();
    if (csrfToken) headers[CSRF_HEADER] = csrfToken;
  }
  const res = await fetch(`/api${path}`, {
    method,
    headers,
    credentials: 'same-origin',
    body: body === undefined ? undefined : form ? body : JSON.stringify(body),
  });
  if (res.status === 204) return undefined as T;
  const data = (await res.json().catch(() => null)) as
    | { error?: { code?: string; message?: string; field?: string } }
    | null;
  if (!res.ok) {
    const error = data?.error;
    // A stale token (the session was renewed elsewhere): fetch the current one and try once more.
    if (res.status === 403 && error?.code === 'csrf' && !retried) {
      await refreshCsrfToken();
      return send<T>(method, path, body, true);
    }
    throw new ApiError(res.status, error?.code ?? 'http_error', error?.message ?? `Request failed (${res.status}).`, error?.field);
  }
  return data as T;
}

/**
 * Typed calls to /api. Paths are relative to /api.
 *
 * @example
 * const { users } = await api.get<UserListDTO>('/users');
 */
export const api = {
  get: <T>(path: string) => send<T>('GET', path),
  post: <T>(path: string, body?: unknown) => send<T>('POST', path, body ?? {}),
  /** multipart/form-data, for uploads: the browser streams the file. */
  postForm: <T>(path: string, form: FormData) => send<T>('POST', path, form),
  put: <T>(path: string, body?: unknown) => send<T>('PUT', path, body ?? {}),
  patch: <T>(path: string, body?: unknown) => send<T>('PATCH', path, body ?? {}),
  delete: <T>(path: string) => send<T>('DELETE', path),
};
