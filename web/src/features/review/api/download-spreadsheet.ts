import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { saveFile } from '../../../lib/save-file';

/** The revision's results tables as an .xlsx file (GET /api/revisions/:id/spreadsheet). */
export function getRevisionSpreadsheet(revisionId: number): Promise<Blob> {
  return api.getFile(`/api/revisions/${revisionId}/spreadsheet`);
}

/** Fetches the workbook and hands it to the browser as a download named `fileName`. */
export function useDownloadSpreadsheet(revisionId: number, fileName: string) {
  return useMutation({
    mutationFn: () => getRevisionSpreadsheet(revisionId),
    onSuccess: (blob) => saveFile(fileName, blob),
  });
}
