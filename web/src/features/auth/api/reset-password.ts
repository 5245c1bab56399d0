import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type ResetPasswordInput = { token: string; newPassword: string };

/** Sets a new password from a one-time link; answers with the account's e-mail. */
export async function resetPassword(input: ResetPasswordInput): Promise<{ email: string }> {
  return api.post<{ email: string }>('/api/auth/password-reset', input);
}

export const useResetPassword = () => useMutation({ mutationFn: resetPassword });
