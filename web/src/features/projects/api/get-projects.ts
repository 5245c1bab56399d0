import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { Project } from '../../../../../core/contract/projects';

export async function getProjects(): Promise<Project[]> {
  const body = await api.get<{ projects: Project[] }>('/api/projects');
  return body.projects;
}

export const getProjectsQueryOptions = () =>
  queryOptions({ queryKey: ['projects', 'list'], queryFn: getProjects });

export const useProjects = () => useQuery(getProjectsQueryOptions());
