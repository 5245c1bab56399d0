import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type Verification = {
  verdict: 'genuine' | 'does-not-match' | 'unknown-code';
  code: string | null;
  sheet: { number: string; title: string } | null;
  project: { jobNumber: string; name: string } | null;
  revision: { number: number; status: string; supersededAt: string | null } | null;
  principal: { name: string; licenceNumber: string; jurisdiction: string } | null;
  sealedAt: string | null;
  digest: string | null;
  /** 2: sheet, project and principal are the sealed values; 1: an older seal, names not sealed. */
  payloadVersion: number | null;
  /** Today's names where they differ from the sealed ones; not part of the seal. */
  now: {
    sheetNumber?: string;
    sheetTitle?: string;
    projectJobNumber?: string;
    projectName?: string;
  } | null;
  reasons: string[];
  notes: string[];
};

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
