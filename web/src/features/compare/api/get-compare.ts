import { queryOptions, useQuery } from '@tanstack/react-query';
import type {
  CompareResponse,
  CompareSide,
  RemarkInContext,
} from '../../../../../core/contract/compare';
import type { RevisionsResponse, RevisionSummary } from '../../../../../core/contract/revisions';
import type { ResultChange } from '../../../../../core/index';
import { api } from '../../../lib/api-client';

export type { BlockChange, CriterionFlip } from '../../../../../core/contract/compare';
export type { CompareSide, RemarkInContext, ResultChange };

/** The comparison as the server sends it (the contract's), its changed values read as the engine's. */
export type Comparison = Omit<CompareResponse, 'results'> & { results: ResultChange[] };

export type RevisionChoice = Pick<RevisionSummary, 'id' | 'number' | 'status'>;

export async function getComparison(
  sheetId: number,
  from: number,
  to: number | 'draft',
): Promise<Comparison> {
  return api.get<CompareResponse>(
    `/api/sheets/${sheetId}/compare?from=${from}&to=${to}`,
  ) as Promise<Comparison>;
}

export const getComparisonQueryOptions = (sheetId: number, from: number, to: number | 'draft') =>
  queryOptions({
    queryKey: ['sheets', 'compare', sheetId, from, to],
    queryFn: () => getComparison(sheetId, from, to),
  });

export const useComparison = (sheetId: number, from: number | null, to: number | 'draft' | null) =>
  useQuery({
    ...getComparisonQueryOptions(sheetId, from ?? 0, to ?? 'draft'),
    enabled: from !== null && to !== null,
  });

export async function getRevisionChoices(sheetId: number): Promise<RevisionChoice[]> {
  const body = await api.get<RevisionsResponse>(`/api/sheets/${sheetId}/revisions`);
  return [...body.revisions].sort((a, b) => a.number - b.number);
}

export const useRevisionChoices = (sheetId: number) =>
  useQuery({
    queryKey: ['revisions', 'list', sheetId, 'choices'],
    queryFn: () => getRevisionChoices(sheetId),
  });
