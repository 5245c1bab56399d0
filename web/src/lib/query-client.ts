import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api-client';

// The signed-in person lives under this key; the auth feature owns the query, the shell reads it.
export const ME_QUERY_KEY = ['auth', 'me'] as const;

export function createQueryClient(): QueryClient {
  // A session that ended (expired, signed out elsewhere) sends the person back to sign in: the
  // signed-in person is asked for again, and the protected pages redirect when it is gone.
  const onError = (error: unknown) => {
    if (isApiError(error) && error.status === 401 && error.code !== 'INVALID_CREDENTIALS') {
      void client.invalidateQueries({ queryKey: ME_QUERY_KEY });
    }
  };
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({ onError }),
    mutationCache: new MutationCache({ onError }),
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
