import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { ActivityEntry } from '../../../../../core/contract/activity';

export async function getSheetActivity(sheetId: number): Promise<ActivityEntry[]> {
  return (await api.get<{ activity: ActivityEntry[] }>(`/api/sheets/${sheetId}/activity`)).activity;
}

export const getSheetActivityQueryOptions = (sheetId: number) =>
  queryOptions({
    queryKey: ['sheets', 'activity', sheetId],
    queryFn: () => getSheetActivity(sheetId),
  });

export const useSheetActivity = (sheetId: number) =>
  useQuery(getSheetActivityQueryOptions(sheetId));
