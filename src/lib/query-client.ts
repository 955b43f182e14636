import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
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

export const queryClient = new QueryClient({
  queryCache: new QueryCache({ onError: onAnyError }),
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
