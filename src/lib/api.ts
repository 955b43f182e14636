import type { ErrorBody } from '../../shared/schemas/common';
import type { SessionBody } from '../../shared/schemas/session';
import { markDatabaseUnavailable } from './database-status';
import { toQueryString } from './list-query';
import { queryClient } from './query-client';

export { toQueryString };
import { sessionKeys, type ListParams } from './query-keys';

/**
 * The one client of the HTTP API: JSON calls and multipart uploads (with progress) share the CSRF
 * token, the error envelope, the 503 database_unavailable banner and the 429 handler below.
 */
const BASE = '/api/v1';

export interface ErrorDetail {
  path: string;
  message: string;
}

/** The server's error envelope, or a stand-in when the server could not be reached. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: ErrorDetail[];
  /** Seconds the server asked us to wait (Retry-After on 429 and 503), when it said. */
  readonly retryAfterS: number | null;

  constructor(status: number, code: string, message: string, details: ErrorDetail[] = [], retryAfterS: number | null = null) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
    this.retryAfterS = retryAfterS;
  }
}

/** What a failed call says to a person: the server's message, or the fallback for anything else. */
export function errorMessage(error: unknown, fallback = 'Something went wrong. Try again.'): string {
  return error instanceof ApiError ? error.message : fallback;
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

// The token rotates with the session, so it is read from the session query at call time.
async function csrfToken(): Promise<string | undefined> {
  const cached = queryClient.getQueryData<SessionBody>(sessionKeys.current());
  if (cached?.csrfToken) return cached.csrfToken;
  const session = await request<SessionBody>('GET', '/session');
  queryClient.setQueryData(sessionKeys.current(), session);
  return session.csrfToken;
}

const NETWORK_MESSAGE = 'Could not reach the Parapet server. Check your connection and try again.';
const networkError = () => new ApiError(0, 'network_error', NETWORK_MESSAGE);

/** Retry-After as seconds (RFC 9110 §10.2.3: delay-seconds or an HTTP date); null when absent or unreadable. */
export function parseRetryAfter(header: string | null, nowMs = Date.now()): number | null {
  if (!header) return null;
  const text = header.trim();
  if (/^\d+$/.test(text)) return Number(text);
  const at = Date.parse(text);
  return Number.isNaN(at) ? null : Math.max(0, Math.ceil((at - nowMs) / 1000));
}

const waitWords = (seconds: number) => (seconds < 90 ? `${seconds} s` : `${Math.ceil(seconds / 60)} min`);

/** The one 429 handler: the server's words plus how long to wait, so the person knows when to try again. */
function tooMany(message: string | undefined, retryAfterS: number | null, details: ErrorDetail[]): ApiError {
  const base = message ?? 'Too many attempts. Wait a little and try again.';
  const text = retryAfterS === null ? base : `${base} (try again in ${waitWords(Math.max(1, retryAfterS))})`;
  return new ApiError(429, 'rate_limited', text, details, retryAfterS);
}

/** The error a failed answer stands for, from its status, Retry-After header and (if any) JSON body. */
export function errorFrom(status: number, statusText: string, retryAfter: string | null, body: unknown): ApiError {
  const error = (body as Partial<ErrorBody> | null)?.error;
  const given = error && typeof error.message === 'string' ? error : undefined;
  const details = given?.details ?? [];
  const wait = parseRetryAfter(retryAfter);
  if (status === 429) return tooMany(given?.message, wait, details);
  let result: ApiError;
  if (given) result = new ApiError(status, given.code ?? `http_${status}`, given.message, details, wait);
  else {
    const fallback =
      status === 401
        ? 'You are signed out. Sign in again to continue.'
        : status === 503
          ? 'The server is busy or its database is down. Try again in a minute.'
          : `The server answered ${status}${statusText ? ` ${statusText}` : ''}. Try again, or tell an admin if it keeps happening.`;
    result = new ApiError(status, `http_${status}`, fallback, [], wait);
  }
  if (result.code === 'database_unavailable') markDatabaseUnavailable();
  return result;
}

function parseJson(text: string): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return null;
  }
}

async function request<T>(method: Method, path: string, body?: unknown, query?: ListParams): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET') {
    const token = await csrfToken();
    if (token) headers['X-CSRF-Token'] = token;
  }
  let response: Response;
  let text: string;
  try {
    response = await fetch(`${BASE}${path}${toQueryString(query)}`, {
      method,
      headers,
      credentials: 'same-origin',
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    text = await response.text();
  } catch {
    throw networkError();
  }
  if (!response.ok) throw errorFrom(response.status, response.statusText, response.headers.get('Retry-After'), parseJson(text));
  if (response.status === 204 || text === '') return undefined as T;
  return JSON.parse(text) as T;
}

export interface UploadProgress {
  loaded: number;
  /** Bytes in all, or null when the browser cannot tell. */
  total: number | null;
}

/**
 * A multipart POST (files). fetch cannot report upload progress, so this one call goes through
 * XMLHttpRequest; the token, errors and banner are the same as for JSON calls.
 */
async function upload<T>(path: string, form: FormData, onProgress?: (progress: UploadProgress) => void): Promise<T> {
  const token = await csrfToken();
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `${BASE}${path}`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    if (token) xhr.setRequestHeader('X-CSRF-Token', token);
    if (onProgress) {
      xhr.upload.onprogress = (event) => onProgress({ loaded: event.loaded, total: event.lengthComputable ? event.total : null });
    }
    xhr.onerror = () => reject(networkError());
    xhr.onabort = () => reject(networkError());
    xhr.onload = () => {
      const body = parseJson(xhr.responseText);
      if (xhr.status >= 200 && xhr.status < 300) resolve(body as T);
      else reject(errorFrom(xhr.status, xhr.statusText, xhr.getResponseHeader('Retry-After'), body));
    };
    xhr.send(form);
  });
}

/** A FormData with one file under `field` and any text fields given. */
export function formWith(field: string, file: File, extra: Record<string, string | undefined> = {}): FormData {
  const form = new FormData();
  form.append(field, file);
  for (const [key, value] of Object.entries(extra)) if (value !== undefined) form.append(key, value);
  return form;
}

export const api = {
  get: <T>(path: string, query?: ListParams) => request<T>('GET', path, undefined, query),
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, body ?? {}),
  patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, body),
  put: <T>(path: string, body: unknown) => request<T>('PUT', path, body),
  delete: (path: string) => request<void>('DELETE', path),
  upload,
};
