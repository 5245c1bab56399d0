import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

import type { VerifyResult as Verification } from '../../../../../core/contract/verify';

export type { Verification };

export async function getVerification(code: string): Promise<Verification> {
  return api.get<Verification>(`/api/verify/${encodeURIComponent(code)}`);
}

export const getVerificationQueryOptions = (code: string) =>
  queryOptions({
    queryKey: ['verify', code],
    queryFn: () => getVerification(code),
    // A verdict is recomputed on every visit; never show an old one.
    staleTime: 0,
    gcTime: 0,
    retry: false,
  });

export const useVerification = (code: string) => useQuery(getVerificationQueryOptions(code));
