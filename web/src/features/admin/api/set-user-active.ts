import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { ManagedUser } from './get-users';

/** Deactivates (their sessions end at once) or reactivates a person. */
export async function setUserActive(input: {
  id: number;
  active: boolean;
}): Promise<{ user: ManagedUser; sessionsEnded?: number }> {
  const verb = input.active ? 'reactivate' : 'deactivate';
  return api.post<{ user: ManagedUser; sessionsEnded?: number }>(`/api/users/${input.id}/${verb}`);
}

export const useSetUserActive = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: setUserActive,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['users', 'list'] }),
  });
};
