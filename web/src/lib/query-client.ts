import { QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api-client';

// The signed-in person lives under this key; the auth feature owns the query, the shell reads it.
export const ME_QUERY_KEY = ['auth', 'me'] as const;

export function createQueryClient(): QueryClient {
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError: (error) => {
        // A session that ended (expired, signed out elsewhere) sends the person back to sign in.
        if (isApiError(error) && error.status === 401) {
          void client.invalidateQueries({ queryKey: ME_QUERY_KEY });
        }
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        refetchOnWindowFocus: false,
        // A 4xx answer will not change on retry; a dropped connection or a 5xx might.
        retry: (failureCount, error) =>
          !(isApiError(error) && error.status >= 400 && error.status < 500) && failureCount < 2,
      },
      mutations: { retry: false },
    },
  });
  return client;
}
