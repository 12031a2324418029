import type { FieldIssue } from '@shared/schemas/common';
import { SAVED_AT_HEADER } from '@shared/offline';
import { noteSavedCopy } from './offline/saved-copy';

/** A failed API call, parsed from the one error shape. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }

  /** Field problems keyed by field name (the last path segment after body/query/params). */
  get fieldErrors(): Record<string, string> {
    const out: Record<string, string> = {};
    if (!Array.isArray(this.details)) return out;
    for (const d of this.details as FieldIssue[]) {
      const key = d.path.replace(/^(body|query|params)\.?/, '');
      if (key && !out[key]) out[key] = d.message;
    }
    return out;
  }
}

let csrfToken: string | null = null;
let csrfPending: Promise<string> | null = null;

async function fetchCsrf(): Promise<string> {
  csrfPending ??= fetch('/api/csrf', { credentials: 'same-origin' })
    .then(async (r) => {
      const json = await r.json();
      csrfToken = json.data.token as string;
      return csrfToken;
    })
    .finally(() => {
      csrfPending = null;
    });
  return csrfPending;
}

/** Forget the token after sign-in or sign-out (the session id changes). */
export function resetCsrf() {
  csrfToken = null;
}

type Options = { query?: Record<string, string | number | boolean | undefined | null>; body?: unknown; signal?: AbortSignal; raw?: boolean };

function withQuery(path: string, query?: Options['query']) {
  if (!query) return path;
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) if (v !== undefined && v !== null && v !== '') params.set(k, String(v));
  const qs = params.toString();
  return qs ? `${path}?${qs}` : path;
}

async function parseError(res: Response): Promise<ApiError> {
  try {
    const json = await res.json();
    if (json?.error?.code) return new ApiError(res.status, json.error.code, json.error.message, json.error.details);
  } catch {
    /* not JSON */
  }
  return new ApiError(
    res.status,
    res.status >= 500 ? 'internal_error' : 'http_error',
    res.status === 503 ? 'The service is unavailable right now. Try again in a moment.' : `Request failed (${res.status})`,
  );
}

async function request<T>(method: string, path: string, opts: Options = {}, retried = false): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  const mutating = method !== 'GET';
  if (mutating) headers['x-csrf-token'] = csrfToken ?? (await fetchCsrf());
  let body: BodyInit | undefined;
  if (opts.body instanceof FormData) body = opts.body;
  else if (opts.body !== undefined) {
    headers['Content-Type'] = 'application/json';
    body = JSON.stringify(opts.body);
  }
  let res: Response;
  try {
    res = await fetch(withQuery(path, opts.query), { method, headers, body, credentials: 'same-origin', signal: opts.signal });
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err;
    throw new ApiError(0, 'network_error', 'Cannot reach Tunewright. Check your connection; nothing you typed has been lost.');
  }
  // The service worker answered from its store (the network failed): the page says it shows a saved copy.
  if (!mutating) noteSavedCopy(res.headers.get(SAVED_AT_HEADER));
  if (!res.ok) {
    const error = await parseError(res);
    if (error.code === 'csrf_invalid' && !retried) {
      resetCsrf();
      return request<T>(method, path, opts, true);
    }
    throw error;
  }
  if (res.status === 204) return undefined as T;
  if (opts.raw) return res as unknown as T;
  return (await res.json()) as T;
}

/**
 * A multipart upload with progress (fetch cannot report upload progress; XMLHttpRequest can). Same CSRF
 * handling and the same ApiError as every other call.
 */
function upload<T>(path: string, form: FormData, onProgress?: (fraction: number) => void, retried = false): Promise<T> {
  return (csrfToken ? Promise.resolve(csrfToken) : fetchCsrf()).then(
    (token) =>
      new Promise<T>((resolve, reject) => {
        const xhr = new XMLHttpRequest();
        xhr.open('POST', path);
        xhr.withCredentials = true;
        xhr.setRequestHeader('x-csrf-token', token);
        xhr.setRequestHeader('Accept', 'application/json');
        xhr.upload.onprogress = (e) => {
          if (e.lengthComputable && onProgress) onProgress(e.loaded / e.total);
        };
        xhr.onerror = () => reject(new ApiError(0, 'network_error', 'Cannot reach Tunewright. Check your connection and try again; nothing was stored.'));
        xhr.onload = () => {
          let json: { data?: unknown; error?: { code: string; message: string; details?: unknown } } | null = null;
          try {
            json = JSON.parse(xhr.responseText);
          } catch {
            /* not JSON */
          }
          if (xhr.status >= 200 && xhr.status < 300 && json) return resolve(json as T);
          if (json?.error?.code === 'csrf_invalid' && !retried) {
            resetCsrf();
            return resolve(upload<T>(path, form, onProgress, true));
          }
          reject(
            json?.error?.code
              ? new ApiError(xhr.status, json.error.code, json.error.message, json.error.details)
              : new ApiError(xhr.status, xhr.status >= 500 ? 'internal_error' : 'http_error', `Request failed (${xhr.status})`),
          );
        };
        xhr.send(form);
      }),
  );
}

/** The one API client: JSON envelopes in and out, CSRF handled, errors as ApiError. */
export const api = {
  get: <T>(path: string, opts?: Omit<Options, 'body'>) => request<T>('GET', path, opts),
  post: <T>(path: string, body?: unknown, opts?: Options) => request<T>('POST', path, { ...opts, body }),
  patch: <T>(path: string, body?: unknown, opts?: Options) => request<T>('PATCH', path, { ...opts, body }),
  put: <T>(path: string, body?: unknown, opts?: Options) => request<T>('PUT', path, { ...opts, body }),
  delete: <T>(path: string, opts?: Options) => request<T>('DELETE', path, opts),
  upload,
};

export type Envelope<T> = { data: T };
export type ListEnvelope<T, M = Record<string, unknown>> = { data: T[]; meta: M };
