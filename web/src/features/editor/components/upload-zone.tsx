import { useRef, useState, type ReactNode } from 'react';
import { Alert } from '../../../components/ui/alert';
import { useUploadMatrixFile } from '../api/uploads';
import { uploadBlockSource } from '../lib/blocks';

/**
 * Drop a K or M file (Matrix Market `.mtx` or `.csv`) anywhere on the blocks, or pick one: each
 * upload becomes a `matrix` block that refers to it by name.
 */
export function UploadZone({
  sheetId,
  enabled,
  onUploaded,
  children,
}: {
  sheetId: number;
  enabled: boolean;
  onUploaded: (blockSource: string) => void;
  children: ReactNode;
}) {
  const upload = useUploadMatrixFile(sheetId);
  const input = useRef<HTMLInputElement>(null);
  const [over, setOver] = useState(false);
  const [errors, setErrors] = useState<string[]>([]);

  const send = async (files: readonly File[]) => {
    const problems: string[] = [];
    for (const file of files) {
      try {
        const stored = await upload.mutateAsync(file);
        onUploaded(uploadBlockSource(stored.name));
      } catch (error) {
        const line =
          error && typeof error === 'object' && 'details' in error
            ? (error as { details?: { line?: unknown } }).details?.line
            : undefined;
        const message = error instanceof Error ? error.message : 'The upload failed.';
        problems.push(
          `${file.name}: ${message}${typeof line === 'number' && !message.includes(`line ${line}`) ? ` (line ${line})` : ''}`,
        );
      }
    }
    setErrors(problems);
  };

  if (!enabled) return <div>{children}</div>;
  return (
    <div
      onDragOver={(e) => {
        if (!e.dataTransfer.types.includes('Files')) return;
        e.preventDefault();
        setOver(true);
      }}
      onDragLeave={(e) => {
        if (e.currentTarget.contains(e.relatedTarget as Node | null)) return;
        setOver(false);
      }}
      onDrop={(e) => {
        if (e.dataTransfer.files.length === 0) return;
        e.preventDefault();
        setOver(false);
        void send(Array.from(e.dataTransfer.files));
      }}
      className={`relative flex flex-col gap-3 rounded-sm ${over ? 'outline-2 outline-dashed outline-accent outline-offset-4' : ''}`}
    >
      {children}
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <label className="cursor-pointer rounded-sm border border-rule-strong bg-paper-sheet px-2 py-0.5 hover:bg-paper-deep">
          Upload K or M file…
          <input
            ref={input}
            type="file"
            accept=".mtx,.csv,text/csv"
            multiple
            className="sr-only"
            onChange={(e) => {
              const files = Array.from(e.target.files ?? []);
              e.target.value = '';
              void send(files);
            }}
          />
        </label>
        <span className="text-xs text-ink-faint">
          Matrix Market (.mtx) or CSV; or drop files on the sheet.
        </span>
        {upload.isPending ? (
          <span className="text-xs text-ink-soft" role="status">
            Uploading…
          </span>
        ) : null}
      </div>
      {errors.length > 0 ? (
        <Alert title="Some files were not uploaded.">
          <ul>
            {errors.map((e, i) => (
              <li key={i}>{e}</li>
            ))}
          </ul>
        </Alert>
      ) : null}
      {over ? (
        <div className="pointer-events-none absolute inset-0 flex items-center justify-center bg-accent-soft/60 text-sm font-medium text-accent-strong">
          Drop to upload as a matrix block
        </div>
      ) : null}
    </div>
  );
}
