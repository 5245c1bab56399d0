import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SheetResults } from '../../../components/results';
import { api } from '../../../lib/api-client';

type Person = { id: number; name: string } | null;

export type PrintPackage = {
  firm: { name: string };
  project: { id: number; jobNumber: string; name: string; client: string; site: string };
  sheet: { id: number; number: string; title: string; subject: string | null };
  revision: {
    id: number;
    number: number;
    status: string;
    purpose: string;
    preparedBy: Person;
    preparedAt: string;
    checkedBy: Person;
    checkedAt: string | null;
    sealedBy: Person;
    sealedAt: string | null;
    digests: { canonicalText: string; results: string };
    engineVersion: string;
    preliminary: boolean;
    banner: string | null;
  };
  history: {
    number: number;
    status: string;
    purpose: string;
    issuedBy: Person;
    issuedAt: string;
    checkedBy: Person;
    checkedAt: string | null;
    sealedBy: Person;
    sealedAt: string | null;
    sealCode: string | null;
  }[];
  blocks: { id: string; kind: string; source: string }[];
  results: SheetResults;
  /** The revision's settings: the units its results are shown in. */
  settings?: { units?: string };
  seal: {
    code: string;
    digest: string;
    signature: string;
    principal: { name: string; licenceNumber: string; jurisdiction: string };
    sealedAt: string;
    engineVersion: string;
    verifyPath: string;
  } | null;
  caution: string;
};

export async function getPrint(revisionId: number): Promise<PrintPackage> {
  return api.get<PrintPackage>(`/api/revisions/${revisionId}/print`);
}

export const getPrintQueryOptions = (revisionId: number) =>
  queryOptions({
    queryKey: ['revisions', 'print', revisionId],
    queryFn: () => getPrint(revisionId),
  });

export const usePrint = (revisionId: number) => useQuery(getPrintQueryOptions(revisionId));
