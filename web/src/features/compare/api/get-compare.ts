import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BlockChange, CriterionFlip, ResultChange } from '../../../../../core/index';
import type { UnitSystem } from '../../../../../core/display-units';
import { api } from '../../../lib/api-client';

export type { BlockChange, CriterionFlip, ResultChange } from '../../../../../core/index';

export type CompareSide =
  | { kind: 'revision'; id: number; number: number; status: string; issuedAt: string }
  | { kind: 'draft'; draftVersion: number };

export type RemarkInContext = {
  id: number;
  revisionId: number;
  revisionNumber: number;
  blockId: string;
  line: number;
  type: 'error' | 'query' | 'editorial';
  text: string;
  state: 'open' | 'answered' | 'closed';
  author: { id: number; name: string };
  /** For a remark carried from an earlier revision: the remark it continues. */
  carriedFrom?: { remarkId: number; revisionNumber: number; line: number } | null;
  mapped: { status: 'same' | 'changed' | 'gone'; blockId: string | null; line: number | null };
};

export type Comparison = {
  from: CompareSide;
  to: CompareSide;
  /** The display unit system of each side; absent from servers before display units. */
  units?: { from: UnitSystem; to: UnitSystem };
  blocks: BlockChange[];
  results: ResultChange[];
  flipped: CriterionFlip[];
  summary: {
    added: number;
    removed: number;
    changed: number;
    moved: number;
    resultsChanged: number;
    flipped: number;
  };
  remarks: RemarkInContext[];
};

export type RevisionChoice = { id: number; number: number; status: string };

export async function getComparison(
  sheetId: number,
  from: number,
  to: number | 'draft',
): Promise<Comparison> {
  return api.get<Comparison>(`/api/sheets/${sheetId}/compare?from=${from}&to=${to}`);
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
  const body = await api.get<{ revisions: RevisionChoice[] }>(`/api/sheets/${sheetId}/revisions`);
  return [...body.revisions].sort((a, b) => a.number - b.number);
}

export const useRevisionChoices = (sheetId: number) =>
  useQuery({
    queryKey: ['revisions', 'list', sheetId, 'choices'],
    queryFn: () => getRevisionChoices(sheetId),
  });
