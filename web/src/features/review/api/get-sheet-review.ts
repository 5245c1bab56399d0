// The few sheet fields the review screens need (status, roles, names); kept under its own key so
// it never overwrites the editor's copy of the draft.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { SheetDetail, SheetResponse } from '../../../../../core/contract/sheets';

export type SheetReviewInfo = Pick<
  SheetDetail,
  | 'id'
  | 'projectId'
  | 'number'
  | 'title'
  | 'status'
  | 'latestRevision'
  | 'projectJobNumber'
  | 'projectName'
  | 'myRoles'
>;

export async function getSheetReview(sheetId: number): Promise<SheetReviewInfo> {
  return (await api.get<SheetResponse>(`/api/sheets/${sheetId}`)).sheet;
}

export const getSheetReviewQueryOptions = (sheetId: number) =>
  queryOptions({
    queryKey: ['sheets', 'review', sheetId],
    queryFn: () => getSheetReview(sheetId),
  });

export const useSheetReview = (sheetId: number, enabled = true) =>
  useQuery({ ...getSheetReviewQueryOptions(sheetId), enabled });
