import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

/** Mails the person a one-time link to set a new password. */
export async function sendPasswordReset(id: number): Promise<{ expiresAt: string }> {
  return api.post<{ expiresAt: string }>(`/api/users/${id}/password-reset`);
}

export const useSendPasswordReset = () => useMutation({ mutationFn: sendPasswordReset });
