import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { invalidateAfterMembershipChange } from './invalidate';

export async function removeMember(projectId: number, userId: number): Promise<void> {
  await api.delete(`/api/projects/${projectId}/members/${userId}`);
}

export const useRemoveMember = (projectId: number) => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: number) => removeMember(projectId, userId),
    onSuccess: () => invalidateAfterMembershipChange(queryClient, projectId),
  });
};
