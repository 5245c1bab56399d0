import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { SheetSummary } from './types';

export const sheetsQueryKey = (projectId: number) => ['sheets', 'list', projectId] as const;

export function getSheets(projectId: number): Promise<{ sheets: SheetSummary[] }> {
  return api.get<{ sheets: SheetSummary[] }>(`/api/projects/${projectId}/sheets`);
}

export function getSheetsQueryOptions(projectId: number) {
  return queryOptions({ queryKey: sheetsQueryKey(projectId), queryFn: () => getSheets(projectId) });
}

export function useSheets(projectId: number) {
  return useQuery(getSheetsQueryOptions(projectId));
}
