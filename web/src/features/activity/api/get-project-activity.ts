import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { ActivityEntry } from '../../../../../core/contract/activity';

export async function getProjectActivity(projectId: number): Promise<ActivityEntry[]> {
  const body = await api.get<{ activity: ActivityEntry[] }>(`/api/projects/${projectId}/activity`);
  return body.activity;
}

export const getProjectActivityQueryOptions = (projectId: number) =>
  queryOptions({
    queryKey: ['activity', 'project', projectId],
    queryFn: () => getProjectActivity(projectId),
  });

export const useProjectActivity = (projectId: number) =>
  useQuery(getProjectActivityQueryOptions(projectId));
