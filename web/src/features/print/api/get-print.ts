import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PrintResponse } from '../../../../../core/contract/print';
import type { SheetResults } from '../../../components/results';
import { api } from '../../../lib/api-client';

/** A revision's print as the server sends it (the contract's), its results read as the engine's. */
export type PrintPackage = Omit<PrintResponse, 'results'> & { results: SheetResults };

export async function getPrint(revisionId: number): Promise<PrintPackage> {
  return api.get<PrintResponse>(`/api/revisions/${revisionId}/print`) as Promise<PrintPackage>;
}

export const getPrintQueryOptions = (revisionId: number) =>
  queryOptions({
    queryKey: ['revisions', 'print', revisionId],
    queryFn: () => getPrint(revisionId),
  });

export const usePrint = (revisionId: number) => useQuery(getPrintQueryOptions(revisionId));
