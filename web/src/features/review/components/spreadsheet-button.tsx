import { useDownloadSpreadsheet } from '../api/download-spreadsheet';

/**
 * "Tables as spreadsheet": the revision's modes, response and criteria tables as an .xlsx file in
 * the units the sheet shows, with the units in the headers. Not printed.
 */
export function SpreadsheetButton({
  revisionId,
  fileStem,
}: {
  revisionId: number;
  /** "DYN-01_Rev2": the file is DYN-01_Rev2_tables.xlsx, as the server names it. */
  fileStem: string;
}) {
  const safe = fileStem.replace(/[^A-Za-z0-9._-]+/g, '_');
  const download = useDownloadSpreadsheet(revisionId, `${safe}_tables.xlsx`);
  return (
    <span className="flex items-baseline gap-2 print:hidden">
      <button
        type="button"
        className="text-accent-strong hover:underline disabled:text-ink-faint"
        disabled={download.isPending}
        onClick={() => download.mutate()}
      >
        {download.isPending ? 'Preparing the spreadsheet…' : 'Tables as spreadsheet (.xlsx)'}
      </button>
      {download.isError ? (
        <span role="alert" className="text-xs text-fail">
          The spreadsheet was not made: {download.error.message}
        </span>
      ) : null}
    </span>
  );
}
