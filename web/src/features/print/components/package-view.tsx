import { useCallback, useState } from 'react';
import { Link } from 'react-router-dom';
import { QueryError } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { formatUtc } from '../../../lib/format';
import { packagePdfHref, usePackage, type CalculationPackage } from '../api/get-package';
import { RevisionPages, STATUS } from './print-view';
import { RemarksRecord } from './remarks-record';
import { SealQr } from './seal-qr';
import { useFitToWidth } from '../lib/use-fit-to-width';

const day = (iso: string | null) => (iso ? formatUtc(iso).slice(0, 10) : '—');

/**
 * A project's calculation package: a cover listing the bound sheets, then each chosen revision
 * as its print shows it, with the seal's QR code and the record of check. `data-package-state`
 * tells the server's PDF printer when everything (QR codes included) is on the page.
 */
export function PackageView({
  projectId,
  revisions,
  onChoose,
  backHref,
  verifyUrl,
}: {
  projectId: number;
  revisions: readonly number[] | null;
  onChoose: (revisions: number[]) => void;
  backHref: string;
  verifyUrl: (path: string) => string;
}) {
  const pkg = usePackage(projectId, revisions);
  const fitRef = useFitToWidth();
  const [qrDone, setQrDone] = useState<ReadonlySet<string>>(new Set());
  const onQrReady = useCallback(
    (url: string) => setQrDone((done) => (done.has(url) ? done : new Set([...done, url]))),
    [],
  );

  if (pkg.isPending) return <Spinner label="Composing the calculation package…" />;
  if (pkg.isError) {
    return (
      <div data-package-state="error">
        <QueryError what="the package" error={pkg.error} onRetry={() => pkg.refetch()} />
      </div>
    );
  }
  const data = pkg.data;
  const sealUrls = data.parts.flatMap((p) => (p.seal ? [verifyUrl(p.seal.verifyPath)] : []));
  const ready = sealUrls.every((u) => qrDone.has(u));
  const chosen = data.parts.map((p) => p.revision.id);

  return (
    <div
      ref={fitRef}
      className="mw-print mx-auto max-w-[210mm] bg-white p-6 shadow-sheet"
      data-package-state={ready ? 'ready' : 'composing'}
    >
      <Toolbar
        data={data}
        chosen={chosen}
        onChoose={onChoose}
        backHref={backHref}
        pdfHref={chosen.length > 0 ? packagePdfHref(projectId, chosen) : null}
      />
      <Cover data={data} />
      {data.parts.map((part) => (
        <div key={part.revision.id} className="mw-sheet-start">
          <RevisionPages
            pkg={part}
            verifyUrl={verifyUrl}
            sealMark={
              part.seal ? (
                <SealQr url={verifyUrl(part.seal.verifyPath)} onReady={onQrReady} />
              ) : null
            }
            record={
              <RemarksRecord
                title={`Record of check — ${part.sheet.number} Rev ${part.revision.number}`}
                revisionNumber={part.revision.number}
                remarks={{ status: 'ready', remarks: part.record.remarks }}
                blocks={part.blocks}
              />
            }
          />
        </div>
      ))}
    </div>
  );
}

function Toolbar({
  data,
  chosen,
  onChoose,
  backHref,
  pdfHref,
}: {
  data: CalculationPackage;
  chosen: number[];
  onChoose: (revisions: number[]) => void;
  backHref: string;
  pdfHref: string | null;
}) {
  function choose(sheetId: number, value: string) {
    const others = data.sheets
      .filter((s) => s.id !== sheetId && s.chosenRevisionId !== null)
      .map((s) => s.chosenRevisionId!);
    onChoose(value ? [...others, Number(value)] : others);
  }
  return (
    <div className="mw-no-print mb-6 flex flex-col gap-3 border-b border-rule pb-4">
      <div className="flex flex-wrap items-center gap-3">
        <Link to={backHref} className="text-sm text-accent-strong hover:underline">
          ← Back to the project
        </Link>
        <Button onClick={() => window.print()} disabled={chosen.length === 0}>
          Print or save as PDF
        </Button>
        {pdfHref ? (
          <a
            href={pdfHref}
            className="rounded-sm border border-rule-strong px-3 py-1.5 text-sm font-medium hover:bg-paper-deep"
          >
            Download PDF
          </a>
        ) : null}
      </div>
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-sm font-semibold">Revisions in the package</legend>
        <p className="text-xs text-ink-faint">
          {data.defaultChoice
            ? 'The latest sealed revision of each sheet (the default).'
            : 'Your choice of revisions.'}{' '}
          Page numbers run across the whole package and are printed at the foot of each page.
        </p>
        <div className="grid gap-2 sm:grid-cols-2">
          {data.sheets.map((s) => (
            <label key={s.id} className="flex flex-col gap-1 text-sm">
              <span>
                Revision of <span className="font-mono">{s.number}</span> {s.title}
              </span>
              <select
                value={s.chosenRevisionId ?? ''}
                onChange={(e) => choose(s.id, e.target.value)}
                className="rounded-sm border border-rule-strong bg-paper-sheet px-2 py-1"
              >
                <option value="">Not included</option>
                {s.revisions.map((r) => (
                  <option key={r.id} value={r.id}>
                    Rev {r.number} — {STATUS[r.status] ?? r.status}
                    {r.sealCode ? ` (${r.sealCode})` : ''}
                  </option>
                ))}
              </select>
            </label>
          ))}
        </div>
      </fieldset>
    </div>
  );
}

function Cover({ data }: { data: CalculationPackage }) {
  const bound = data.parts;
  return (
    <section className="mw-cover" aria-label="Cover">
      <p className="text-[10pt] tracking-wide uppercase">{data.firm.name}</p>
      <h1 className="mt-6 text-[20pt] leading-tight font-semibold">Calculation package</h1>
      <p className="mt-2 text-[14pt]">{data.project.name}</p>
      <dl className="mt-4 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-[10pt]">
        <dt className="text-black/60">Job no.</dt>
        <dd className="font-mono">{data.project.jobNumber}</dd>
        <dt className="text-black/60">Client</dt>
        <dd>{data.project.client}</dd>
        <dt className="text-black/60">Site</dt>
        <dd>{data.project.site}</dd>
      </dl>
      <h2 className="mt-8 mb-1 text-[11pt] font-semibold">Sheets in this package</h2>
      {bound.length === 0 ? (
        <p className="text-[10pt]">
          No sheet has a sealed revision yet; choose the revisions to include above.
        </p>
      ) : (
        <table className="w-full border-collapse text-[9pt]" aria-label="Sheets in this package">
          <thead>
            <tr className="border-b border-black text-left">
              <th className="pr-2">Sheet no.</th>
              <th className="pr-2">Title</th>
              <th className="pr-2">Revision</th>
              <th className="pr-2">Status</th>
              <th className="pr-2">Sealed by</th>
              <th className="pr-2">Seal code</th>
            </tr>
          </thead>
          <tbody>
            {bound.map((p) => (
              <tr key={p.revision.id} className="border-b border-black/30">
                <td className="pr-2 font-mono">{p.sheet.number}</td>
                <td className="pr-2">{p.sheet.title}</td>
                <td className="pr-2">Rev {p.revision.number}</td>
                <td className="pr-2">{STATUS[p.revision.status] ?? p.revision.status}</td>
                <td className="pr-2">
                  {p.revision.sealedBy
                    ? `${p.revision.sealedBy.name}, ${day(p.revision.sealedAt)}`
                    : '—'}
                </td>
                <td className="pr-2 font-mono whitespace-nowrap">{p.seal?.code ?? '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {bound.some((p) => !p.seal) ? (
        <p className="mt-3 border-2 border-black px-2 py-1 text-[9pt] font-semibold">
          This package includes revisions that are not sealed: they are preliminary, not for
          construction.
        </p>
      ) : null}
      <p className="mt-6 border border-black/60 px-2 py-1 text-[8.5pt]" aria-label="Caution">
        <strong>Caution. </strong>
        {bound[0]?.caution ??
          'Results must be verified by a qualified engineer; built-in criteria do not replace the codes adopted by the authority having jurisdiction or licensed professional judgement.'}
      </p>
    </section>
  );
}
