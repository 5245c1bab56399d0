import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { ProjectRole } from '../../../config/words';
import type { Member } from '../../../../../core/contract/projects';
import { invalidateAfterMembershipChange } from './invalidate';

export async function changeMemberRoles(
  projectId: number,
  userId: number,
  roles: ProjectRole[],
): Promise<Member> {
  const body = await api.patch<{ member: Member }>(`/api/projects/${projectId}/members/${userId}`, {
    roles,
  });
  return body.member;
}

export const useChangeMemberRoles = (projectId: number) => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, roles }: { userId: number; roles: ProjectRole[] }) =>
      changeMemberRoles(projectId, userId, roles),
    onSuccess: () => invalidateAfterMembershipChange(queryClient, projectId),
  });
};
