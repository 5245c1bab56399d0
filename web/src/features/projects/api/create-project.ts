import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { Project } from '../../../../../core/contract/projects';

export type CreateProjectInput = { jobNumber: string; name: string; client: string; site: string };

export async function createProject(input: CreateProjectInput): Promise<Project> {
  const body = await api.post<{ project: Project }>('/api/projects', input);
  return body.project;
}

export const useCreateProject = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createProject,
    onSuccess: (project) => {
      queryClient.setQueryData(['projects', 'detail', project.id], project);
      return queryClient.invalidateQueries({ queryKey: ['projects', 'list'] });
    },
  });
};
