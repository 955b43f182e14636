import { MutationCache, QueryCache, QueryClient, type Query } from '@tanstack/react-query';
import { sessionKeys } from './query-keys';

function isSignedOutError(error: unknown): boolean {
  return typeof error === 'object' && error !== null && (error as { status?: number }).status === 401;
}

function isClientError(error: unknown): boolean {
  const status = (error as { status?: number } | null)?.status;
  return typeof status === 'number' && status >= 400 && status < 500;
}

// A 401 anywhere means the session ended: refetch it so the guard sends the person to sign in.
function onAnyError(error: unknown) {
  if (isSignedOutError(error)) void queryClient.invalidateQueries({ queryKey: sessionKeys.current() });
}

/**
 * One key, one shape: a resource's list key ([resource, 'list', params], lib/query-keys.ts) always holds the list
 * envelope. Anything else there means two readers disagree about the key, which crashes whichever page reads it
 * next; it is logged as an error so the one-session browser walk (tests/e2e/walk.test.ts) fails on it.
 */
export function checkListShape(data: unknown, query: Pick<Query, 'queryKey'>): boolean {
  if (query.queryKey[1] !== 'list') return true;
  const body = data as { data?: unknown; pagination?: unknown } | null;
  const ok = typeof body === 'object' && body !== null && Array.isArray(body.data) && typeof body.pagination === 'object' && body.pagination !== null;
  if (!ok)
    console.error(
      `The query ${JSON.stringify(query.queryKey)} holds something other than a list envelope {data, pagination}: read it through listQuery (lib/resource.ts).`,
    );
  return ok;
}

export const queryClient = new QueryClient({
  queryCache: new QueryCache({ onError: onAnyError, onSuccess: checkListShape }),
  mutationCache: new MutationCache({ onError: onAnyError }),
  defaultOptions: {
    queries: {
      staleTime: 30_000,
      refetchOnWindowFocus: false,
      // Retrying a 4xx only repeats the same answer; network and 5xx may recover.
      retry: (failureCount, error) => !isClientError(error) && failureCount < 2,
    },
  },
});
