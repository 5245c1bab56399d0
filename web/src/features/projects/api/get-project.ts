import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { Project } from '../../../../../core/contract/projects';

export async function getProject(projectId: number): Promise<Project> {
  const body = await api.get<{ project: Project }>(`/api/projects/${projectId}`);
  return body.project;
}

export const getProjectQueryOptions = (projectId: number) =>
  queryOptions({
    queryKey: ['projects', 'detail', projectId],
    queryFn: () => getProject(projectId),
  });

export const useProject = (projectId: number) => useQuery(getProjectQueryOptions(projectId));
