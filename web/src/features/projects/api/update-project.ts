import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { Project } from '../../../../../core/contract/projects';

export type UpdateProjectInput = Partial<{
  jobNumber: string;
  name: string;
  client: string;
  site: string;
}>;

export async function updateProject(
  projectId: number,
  input: UpdateProjectInput,
): Promise<Project> {
  const body = await api.patch<{ project: Project }>(`/api/projects/${projectId}`, input);
  return body.project;
}

export const useUpdateProject = (projectId: number) => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateProjectInput) => updateProject(projectId, input),
    onSuccess: (project) => {
      queryClient.setQueryData(['projects', 'detail', projectId], project);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: ['projects', 'list'] }),
        queryClient.invalidateQueries({ queryKey: ['activity', 'project', projectId] }),
      ]);
    },
  });
};
