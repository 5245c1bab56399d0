import type { ModesBlockResult } from '../../../../core/index';
import { saveFile } from '../../lib/save-file';
import { modesCsv, shapesCsv } from './modes-csv';
import { useUnits } from './units';

/** Hands CSV text to the browser as a file download (no server round trip: the results are here). */
function download(fileName: string, text: string): void {
  saveFile(fileName, new Blob([text], { type: 'text/csv;charset=utf-8' }));
}

/** A file name safe on every system: letters, digits, dot, dash and underscore. */
function safeName(text: string): string {
  return text.replace(/[^A-Za-z0-9._-]+/g, '_').replace(/^_+|_+$/g, '') || 'modes';
}

/**
 * "Download" links for a modes block: the modes table and the mode shapes as CSV, every value in
 * full and in the page's units, for a response-spectrum spreadsheet or a report. `fileStem` names the files
 * (e.g. "DYN-01_Rev2_deck_v"). Not printed.
 */
export function ModesDownloads({
  result,
  fileStem,
}: {
  result: ModesBlockResult;
  fileStem: string;
}) {
  const units = useUnits();
  if (result.modes.length === 0) return null;
  const stem = safeName(fileStem);
  const hasShapes = !!result.shapes && result.shapes.length > 0;
  const link = 'text-xs text-accent-strong underline underline-offset-2 hover:text-accent';
  return (
    <p className="flex flex-wrap items-baseline gap-x-3 text-xs text-ink-soft print:hidden">
      <span>Download as CSV:</span>
      <button
        type="button"
        className={link}
        onClick={() => download(`${stem}_modes.csv`, modesCsv(result, units.system))}
      >
        Modes table
      </button>
      {hasShapes ? (
        <button
          type="button"
          className={link}
          onClick={() => download(`${stem}_shapes.csv`, shapesCsv(result) ?? '')}
        >
          Mode shapes
        </button>
      ) : null}
    </p>
  );
}
