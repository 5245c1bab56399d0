// The few sheet fields the review screens need (status, roles, names); kept under its own key so
// it never overwrites the editor's copy of the draft.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { SheetStatus } from '../../../../../core/vocabulary';

export type SheetReviewInfo = {
  id: number;
  projectId: number;
  number: string;
  title: string;
  status: SheetStatus;
  latestRevision: { id: number; number: number; status: string } | null;
  projectJobNumber: string;
  projectName: string;
  myRoles: string[];
};

export async function getSheetReview(sheetId: number): Promise<SheetReviewInfo> {
  return (await api.get<{ sheet: SheetReviewInfo }>(`/api/sheets/${sheetId}`)).sheet;
}

export const getSheetReviewQueryOptions = (sheetId: number) =>
  queryOptions({
    queryKey: ['sheets', 'review', sheetId],
    queryFn: () => getSheetReview(sheetId),
  });

export const useSheetReview = (sheetId: number, enabled = true) =>
  useQuery({ ...getSheetReviewQueryOptions(sheetId), enabled });
