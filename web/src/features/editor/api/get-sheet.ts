import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { SheetDetail } from './types';

export function getSheet(sheetId: number | string): Promise<{ sheet: SheetDetail }> {
  return api.get<{ sheet: SheetDetail }>(`/api/sheets/${sheetId}`);
}

export function getSheetQueryOptions(sheetId: number | string) {
  return queryOptions({
    queryKey: ['sheets', 'detail', String(sheetId)],
    queryFn: () => getSheet(sheetId),
    // The editor owns the draft once loaded: a refetch must not overwrite what the author typed.
    staleTime: Infinity,
  });
}

export function useSheet(sheetId: number | string) {
  return useQuery(getSheetQueryOptions(sheetId));
}
