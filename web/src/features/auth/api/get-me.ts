import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, isApiError } from '../../../lib/api-client';
import { ME_QUERY_KEY } from '../../../lib/query-client';
import type { MeResponse, User } from '../../../../../core/contract/people';

/** The signed-in person, or null when no one is signed in (401 is an answer, not a failure). */
export async function getMe(): Promise<User | null> {
  try {
    const body = await api.get<MeResponse>('/api/auth/me');
    return body.user;
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export const getMeQueryOptions = () =>
  queryOptions({ queryKey: ME_QUERY_KEY, queryFn: getMe, staleTime: 5 * 60_000 });

export const useMe = () => useQuery(getMeQueryOptions());
