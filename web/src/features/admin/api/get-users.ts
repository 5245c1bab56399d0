import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { ManagedUser } from '../../../../../core/contract/people';

export type { ManagedUser };

export async function getUsers(): Promise<ManagedUser[]> {
  const body = await api.get<{ users: ManagedUser[] }>('/api/users');
  return body.users;
}

export const getUsersQueryOptions = () =>
  queryOptions({ queryKey: ['users', 'list'], queryFn: getUsers });

export const useUsers = () => useQuery(getUsersQueryOptions());
