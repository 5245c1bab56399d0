import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { ManagedUser } from './get-users';

export type UpdateUserInput = {
  id: number;
  name?: string;
  email?: string;
  licenceNumber?: string;
  jurisdiction?: string;
};

export async function updateUser({ id, ...changes }: UpdateUserInput): Promise<ManagedUser> {
  const body = await api.patch<{ user: ManagedUser }>(`/api/users/${id}`, changes);
  return body.user;
}

export const useUpdateUser = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['users', 'list'] }),
  });
};
