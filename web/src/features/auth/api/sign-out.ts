import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, setCsrfToken } from '../../../lib/api-client';
import { ME_QUERY_KEY } from '../../../lib/query-client';

export async function signOut(): Promise<void> {
  await api.post<void>('/api/auth/sign-out');
  setCsrfToken(null);
}

export const useSignOut = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => {
      queryClient.clear();
      queryClient.setQueryData(ME_QUERY_KEY, null);
    },
  });
};
