import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, setCsrfToken } from '../../../lib/api-client';
import { ME_QUERY_KEY } from '../../../lib/query-client';
import type { SignInResponse, User } from '../../../../../core/contract/people';

export type SignInInput = { email: string; password: string };

export async function signIn(input: SignInInput): Promise<User> {
  const body = await api.post<SignInResponse>('/api/auth/sign-in', input);
  // The session was regenerated at sign-in; its token replaces the anonymous one.
  setCsrfToken(body.csrfToken);
  return body.user;
}

export const useSignIn = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (user) => {
      // Whatever was cached belonged to the previous session.
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== ME_QUERY_KEY[0] });
      queryClient.setQueryData(ME_QUERY_KEY, user);
    },
  });
};
