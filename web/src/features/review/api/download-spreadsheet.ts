import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

/** The revision's results tables as an .xlsx file (GET /api/revisions/:id/spreadsheet). */
export function getRevisionSpreadsheet(revisionId: number): Promise<Blob> {
  return api.getFile(`/api/revisions/${revisionId}/spreadsheet`);
}

/** Fetches the workbook and hands it to the browser as a download named `fileName`. */
export function useDownloadSpreadsheet(revisionId: number, fileName: string) {
  return useMutation({
    mutationFn: () => getRevisionSpreadsheet(revisionId),
    onSuccess: (blob) => {
      const url = URL.createObjectURL(blob);
      const link = document.createElement('a');
      link.href = url;
      link.download = fileName;
      document.body.append(link);
      link.click();
      link.remove();
      // Revoked after the click has been handled, so the download has started.
      setTimeout(() => URL.revokeObjectURL(url), 0);
    },
  });
}
