import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { Member } from '../../../../../core/contract/projects';

export async function getMembers(projectId: number): Promise<Member[]> {
  const body = await api.get<{ members: Member[] }>(`/api/projects/${projectId}/members`);
  return body.members;
}

export const membersQueryKey = (projectId: number) => ['members', 'list', projectId] as const;

export const getMembersQueryOptions = (projectId: number) =>
  queryOptions({ queryKey: membersQueryKey(projectId), queryFn: () => getMembers(projectId) });

export const useMembers = (projectId: number) => useQuery(getMembersQueryOptions(projectId));
