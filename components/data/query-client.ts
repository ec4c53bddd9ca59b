import { QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiRequestError } from './api';

/** Named stale times (ms). Resources add theirs here or next to their key factory. */
export const staleTimes = {
  /** who is signed in and their memberships: changes rarely, refetched on focus */
  session: 5 * 60_000,
  /** member lists: edited by owners, visible to all */
  members: 60_000,
  /** lists that several people edit at once (designs, reviews) */
  sharedList: 30_000,
  /** immutable data (an approved version, a bundle) */
  immutable: Infinity,
} as const;

/** A 4xx answer will not change by asking again. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (isApiRequestError(error) && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

/**
 * The app's QueryClient. `onUnauthorized` runs when any query answers 401 (the
 * session expired or was ended elsewhere), so the session layer can refetch /auth/me.
 */
export function createQueryClient(onUnauthorized: (client: QueryClient) => void): QueryClient {
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError: (error, query) => {
        if (isApiRequestError(error, 401) && query.queryKey[0] !== 'session') onUnauthorized(client);
      },
    }),
    defaultOptions: {
      queries: { retry: shouldRetry, refetchOnWindowFocus: true },
      mutations: { retry: false },
    },
  });
  return client;
}
