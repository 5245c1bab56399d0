import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { ProjectRole } from '../../../config/words';
import type { Member } from '../../../../../core/contract/projects';
import { invalidateAfterMembershipChange } from './invalidate';

export type AddMemberInput = { email: string; roles: ProjectRole[] };

export async function addMember(projectId: number, input: AddMemberInput): Promise<Member> {
  const body = await api.post<{ member: Member }>(`/api/projects/${projectId}/members`, input);
  return body.member;
}

export const useAddMember = (projectId: number) => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AddMemberInput) => addMember(projectId, input),
    onSuccess: () => invalidateAfterMembershipChange(queryClient, projectId),
  });
};
