import type { ErrorBody } from '../../shared/schemas/common';
import type { SessionBody } from '../../shared/schemas/session';
import { markDatabaseUnavailable } from './database-status';
import { queryClient } from './query-client';
import { sessionKeys, type ListParams } from './query-keys';

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

  constructor(status: number, code: string, message: string, details: ErrorDetail[] = []) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export function toQueryString(params?: ListParams): string {
  if (!params) return '';
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value !== undefined && value !== '') search.set(key, String(value));
  }
  const text = search.toString();
  return text ? `?${text}` : '';
}

// The token rotates with the session, so it is read from the session query at call time.
async function csrfToken(): Promise<string | undefined> {
  const cached = queryClient.getQueryData<SessionBody>(sessionKeys.current());
  if (cached?.csrfToken) return cached.csrfToken;
  const session = await request<SessionBody>('GET', '/session');
  queryClient.setQueryData(sessionKeys.current(), session);
  return session.csrfToken;
}

async function errorFrom(response: Response): Promise<ApiError> {
  let body: Partial<ErrorBody> | undefined;
  try {
    body = (await response.json()) as Partial<ErrorBody>;
  } catch {
    body = undefined;
  }
  const error = body?.error;
  if (error && typeof error.message === 'string') {
    return new ApiError(response.status, error.code ?? `http_${response.status}`, error.message, error.details ?? []);
  }
  const fallback =
    response.status === 401
      ? 'You are signed out. Sign in again to continue.'
      : response.status === 503
        ? 'The server is busy or its database is down. Try again in a minute.'
        : `The server answered ${response.status} ${response.statusText}. Try again, or tell an admin if it keeps happening.`;
  return new ApiError(response.status, `http_${response.status}`, fallback);
}

async function request<T>(method: Method, path: string, body?: unknown, query?: ListParams): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET') {
    const token = await csrfToken();
    if (token) headers['X-CSRF-Token'] = token;
  }
  let response: Response;
  try {
    response = await fetch(`${BASE}${path}${toQueryString(query)}`, {
      method,
      headers,
      credentials: 'same-origin',
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, 'network_error', 'Could not reach the Parapet server. Check your connection and try again.');
  }
  if (!response.ok) {
    const error = await errorFrom(response);
    if (error.code === 'database_unavailable') markDatabaseUnavailable();
    throw error;
  }
  if (response.status === 204) return undefined as T;
  return (await response.json()) as T;
}

export const api = {
  get: <T>(path: string, query?: ListParams) => request<T>('GET', path, undefined, query),
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, body ?? {}),
  patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, body),
  put: <T>(path: string, body: unknown) => request<T>('PUT', path, body),
  delete: (path: string) => request<void>('DELETE', path),
};
