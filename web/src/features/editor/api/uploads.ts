import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { writeRequest } from './request';
import type { Upload, UploadResponse, UploadsResponse } from '../../../../../core/contract/uploads';

export const uploadsQueryKey = (sheetId: number | string) =>
  ['sheets', 'uploads', String(sheetId)] as const;

export function getUploadsQueryOptions(sheetId: number | string) {
  return queryOptions({
    queryKey: uploadsQueryKey(sheetId),
    queryFn: () => api.get<UploadsResponse>(`/api/sheets/${sheetId}/uploads`),
  });
}

export function useUploads(sheetId: number | string) {
  return useQuery(getUploadsQueryOptions(sheetId));
}

/** Sends one Matrix Market or CSV file (multipart field `file`). */
export async function uploadMatrixFile(sheetId: number | string, file: File): Promise<Upload> {
  const form = new FormData();
  form.append('file', file, file.name);
  const response = await writeRequest('POST', `/api/sheets/${sheetId}/uploads`, { body: form });
  return ((await response.json()) as UploadResponse).upload;
}

export function useUploadMatrixFile(sheetId: number | string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => uploadMatrixFile(sheetId, file),
    onSuccess: () => client.invalidateQueries({ queryKey: uploadsQueryKey(sheetId) }),
  });
}
