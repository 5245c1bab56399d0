import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { User } from '../../../types/api';

export async function getUsers(): Promise<User[]> {
  const body = await api.get<{ users: User[] }>('/api/users');
  return body.users;
}

export const getUsersQueryOptions = () =>
  queryOptions({ queryKey: ['users', 'list'], queryFn: getUsers });

export const useUsers = () => useQuery(getUsersQueryOptions());
