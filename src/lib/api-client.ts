/**
 * The one API client of the app: same-origin fetch with JSON in and out. Every answer that is not
 * `ok` becomes an {@link ApiError}; a 401 (except from the session probe and sign-in themselves)
 * hands over to the unauthorized handler, which sends the person to the sign-in page.
 */
import type { ApiErrorBody } from '../../shared/api/common.js';

export type FieldErrors = Record<string, string>;

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: FieldErrors;

  constructor(status: number, code: string, message: string, fields: FieldErrors = {}) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.fields = fields;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

type UnauthorizedHandler = (error: ApiError) => void;

/** Paths whose 401 is an answer, not an expired session. */
const NO_REDIRECT_PATHS = new Set(['/api/auth/me', '/api/auth/login']);

let onUnauthorized: UnauthorizedHandler = () => {};

/** Set once at start-up (main.tsx) so the client need not know the router. */
export function configureApiClient(options: { onUnauthorized: UnauthorizedHandler }): void {
  onUnauthorized = options.onUnauthorized;
}

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  body?: unknown;
  signal?: AbortSignal;
}

const STATUS_MESSAGES: Record<number, string> = {
  400: 'The request was not accepted.',
  401: 'Please sign in to continue.',
  403: 'You do not have permission to do that.',
  404: 'That could not be found.',
  409: 'That conflicts with something that already exists.',
  410: 'That link is no longer valid.',
  413: 'That upload is too large.',
  422: 'Some of the values were not accepted.',
  429: 'Too many attempts. Wait a minute and try again.',
};

function fallbackMessage(status: number): string {
  return STATUS_MESSAGES[status] ?? `The server could not complete the request (HTTP ${status}). Try again in a moment.`;
}

function isErrorBody(value: unknown): value is ApiErrorBody {
  if (typeof value !== 'object' || value === null || !('error' in value)) return false;
  const error = (value as { error: unknown }).error;
  return (
    typeof error === 'object' &&
    error !== null &&
    typeof (error as { code?: unknown }).code === 'string' &&
    typeof (error as { message?: unknown }).message === 'string'
  );
}

async function readJson(response: Response): Promise<unknown> {
  const type = response.headers.get('content-type') ?? '';
  if (!type.includes('json')) return undefined;
  try {
    return await response.json();
  } catch {
    return undefined;
  }
}

/** Sends one request and resolves with the parsed JSON body (`undefined` for 204 or a body that is not JSON). */
export async function apiRequest<T>(path: string, options: RequestOptions = {}): Promise<T> {
  const { method = 'GET', body, signal } = options;
  const headers: Record<string, string> = { Accept: 'application/json' };
  const init: RequestInit = { method, headers, credentials: 'same-origin', signal };
  if (body !== undefined) {
    headers['Content-Type'] = 'application/json';
    init.body = JSON.stringify(body);
  }

  let response: Response;
  try {
    response = await fetch(path, init);
  } catch (cause) {
    if (signal?.aborted) throw cause;
    throw new ApiError(0, 'network_error', 'Could not reach the server. Check the connection and try again.');
  }

  if (response.status === 204) return undefined as T;
  const data = await readJson(response);

  if (!response.ok) {
    const error = isErrorBody(data)
      ? new ApiError(response.status, data.error.code, data.error.message, data.error.fields ?? {})
      : new ApiError(response.status, `http_${response.status}`, fallbackMessage(response.status));
    if (response.status === 401 && !NO_REDIRECT_PATHS.has(path.split('?')[0])) onUnauthorized(error);
    throw error;
  }
  // 202 and friends may carry no body; callers of those endpoints expect nothing.
  return data as T;
}

export interface UploadProgress {
  loaded: number;
  /** Bytes in the whole request body, or null when the browser cannot tell. */
  total: number | null;
  /** 0 to 1, or null when the total is unknown. */
  fraction: number | null;
}

export interface UploadOptions {
  method?: 'POST' | 'PUT' | 'PATCH';
  onProgress?: (progress: UploadProgress) => void;
  signal?: AbortSignal;
}

function parseXhrJson(xhr: XMLHttpRequest): unknown {
  const type = xhr.getResponseHeader('content-type') ?? '';
  if (!type.includes('json') || !xhr.responseText) return undefined;
  try {
    return JSON.parse(xhr.responseText);
  } catch {
    return undefined;
  }
}

/**
 * Sends a multipart form with upload progress. `fetch` cannot report how much of a request body
 * has gone out, so this one path uses XMLHttpRequest; errors, 401 hand-off and messages are the
 * same as {@link apiRequest}. An aborted upload rejects with an `AbortError` DOMException.
 */
export function apiUpload<T>(path: string, form: FormData, options: UploadOptions = {}): Promise<T> {
  const { method = 'POST', onProgress, signal } = options;
  return new Promise<T>((resolve, reject) => {
    if (signal?.aborted) {
      reject(new DOMException('The upload was cancelled.', 'AbortError'));
      return;
    }
    const xhr = new XMLHttpRequest();
    xhr.open(method, path);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    const onAbort = () => xhr.abort();
    signal?.addEventListener('abort', onAbort, { once: true });
    const done = () => signal?.removeEventListener('abort', onAbort);

    if (onProgress) {
      xhr.upload.addEventListener('progress', (event) => {
        const total = event.lengthComputable && event.total > 0 ? event.total : null;
        onProgress({ loaded: event.loaded, total, fraction: total ? Math.min(1, event.loaded / total) : null });
      });
    }
    xhr.addEventListener('load', () => {
      done();
      const data = parseXhrJson(xhr);
      if (xhr.status >= 200 && xhr.status < 300) {
        resolve((xhr.status === 204 ? undefined : data) as T);
        return;
      }
      const error = isErrorBody(data)
        ? new ApiError(xhr.status, data.error.code, data.error.message, data.error.fields ?? {})
        : new ApiError(xhr.status, `http_${xhr.status}`, fallbackMessage(xhr.status));
      if (xhr.status === 401) onUnauthorized(error);
      reject(error);
    });
    xhr.addEventListener('error', () => {
      done();
      reject(new ApiError(0, 'network_error', 'The upload did not reach the server. Check the connection and try again; nothing was stored.'));
    });
    xhr.addEventListener('abort', () => {
      done();
      reject(new DOMException('The upload was cancelled.', 'AbortError'));
    });
    xhr.send(form);
  });
}

export const api = {
  get: <T>(path: string, signal?: AbortSignal) => apiRequest<T>(path, { signal }),
  post: <T>(path: string, body?: unknown) => apiRequest<T>(path, { method: 'POST', body }),
  patch: <T>(path: string, body?: unknown) => apiRequest<T>(path, { method: 'PATCH', body }),
  put: <T>(path: string, body?: unknown) => apiRequest<T>(path, { method: 'PUT', body }),
  delete: <T = void>(path: string) => apiRequest<T>(path, { method: 'DELETE' }),
  upload: apiUpload,
};

/** Builds `/sign-in?next=…` for the given in-app location. */
export function signInPath(next: string): string {
  return next && next !== '/' ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in';
}

/** Accepts only in-app paths as a post-sign-in target (no protocol-relative or absolute URLs). */
export function safeNextPath(next: string | null | undefined): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return '/';
  if (next.startsWith('/sign-in')) return '/';
  return next;
}
