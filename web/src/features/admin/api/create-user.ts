import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { User } from '../../../../../core/contract/people';

export type CreateUserInput = {
  email: string;
  name: string;
  password: string;
  isAdmin?: boolean;
  licenceNumber?: string;
  jurisdiction?: string;
};

export async function createUser(input: CreateUserInput): Promise<User> {
  const body = await api.post<{ user: User }>('/api/users', input);
  return body.user;
}

export const useCreateUser = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['users', 'list'] }),
  });
};
