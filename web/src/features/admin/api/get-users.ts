import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { User } from '../../../types/api';

/** A person as the admin screen sees them: with whether (and since when) they are deactivated. */
export type ManagedUser = User & { deactivatedAt: string | null };

export async function getUsers(): Promise<ManagedUser[]> {
  const body = await api.get<{ users: ManagedUser[] }>('/api/users');
  return body.users;
}

export const getUsersQueryOptions = () =>
  queryOptions({ queryKey: ['users', 'list'], queryFn: getUsers });

export const useUsers = () => useQuery(getUsersQueryOptions());
