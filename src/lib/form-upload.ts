import type { SessionBody } from '../../shared/schemas/session';
import { ApiError } from './api';
import { queryClient } from './query-client';
import { sessionKeys } from './query-keys';

/** A multipart POST (files) with the session's CSRF token; errors arrive as the API client's ApiError. */
export async function postForm<T>(path: string, form: FormData): Promise<T> {
  let token = queryClient.getQueryData<SessionBody>(sessionKeys.current())?.csrfToken;
  if (!token) {
    const session = (await (await fetch('/api/v1/session', { credentials: 'same-origin' })).json()) as SessionBody;
    queryClient.setQueryData(sessionKeys.current(), session);
    token = session.csrfToken;
  }
  let response: Response;
  try {
    response = await fetch(`/api/v1${path}`, { method: 'POST', body: form, credentials: 'same-origin', headers: { Accept: 'application/json', 'X-CSRF-Token': token ?? '' } });
  } catch {
    throw new ApiError(0, 'network_error', 'Could not reach the Parapet server. Check your connection and try again.');
  }
  const body = await response.json().catch(() => null);
  if (!response.ok) {
    const e = body?.error;
    throw new ApiError(response.status, e?.code ?? `http_${response.status}`, e?.message ?? `The server answered ${response.status}. Try again.`, e?.details ?? []);
  }
  return body as T;
}
