import { type QueryClient, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { SessionBody, SessionUser, SignInInput } from '../../../../shared/schemas/session';
import { api } from '../../../lib/api';
import { sessionKeys } from '../../../lib/query-keys';

export const getSession = () => api.get<SessionBody>('/session');

const sessionQuery = { queryKey: sessionKeys.current(), queryFn: getSession };

/** Ask for the session at start-up, while the page's own scripts download, instead of once the page mounts. */
export function prefetchSession(queryClient: QueryClient) {
  void queryClient.prefetchQuery(sessionQuery);
}

export function useSession() {
  return useQuery({ ...sessionQuery, staleTime: 5 * 60_000 });
}

/** The signed-in person; only for pages behind the session guard. */
export function useCurrentUser(): SessionUser | null {
  return useSession().data?.user ?? null;
}

// Set when the person signs out themselves, so the guard does not offer to bring them back
// to the page they left (the next person at this browser should start at the overview).
let signedOutOnPurpose = false;

export function wasSignedOutOnPurpose(): boolean {
  return signedOutOnPurpose;
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SignInInput) => api.post<{ user: SessionUser }>('/session', input),
    onSuccess: async () => {
      signedOutOnPurpose = false;
      // Another person may have used this browser: drop their cached data, and take the new CSRF token.
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== sessionKeys.current()[0] });
      await queryClient.fetchQuery({ ...sessionQuery, staleTime: 0 });
    },
  });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => {
      signedOutOnPurpose = true;
      return api.delete('/session');
    },
    onSettled: async () => {
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== sessionKeys.current()[0] });
      await queryClient.fetchQuery({ ...sessionQuery, staleTime: 0 });
    },
  });
}
