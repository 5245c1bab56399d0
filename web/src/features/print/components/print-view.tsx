import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { BlockResultView, UnitSystemProvider } from '../../../components/results';
import { unitSystemOf } from '../../../../../core/display-units';
import { renderMarkdown } from '../../../components/results/markdown';
import { QueryError } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { formatUtc } from '../../../lib/format';
import { usePrint, type PrintPackage } from '../api/get-print';
import { pageMarginCss } from '../lib/page-margins';
import { RemarksRecord, type PrintRemarks } from './remarks-record';
import './print.css';
import { DIGEST_WORDS } from '../../../config/digests';
import { useFitToWidth } from '../lib/use-fit-to-width';

// Markdown's own elements at print sizes (the base styles reset them).
const PRINTED_MARKDOWN = [
  'text-[9pt] leading-snug',
  '[&_h1]:text-[11pt] [&_h1]:font-semibold [&_h2]:text-[10pt] [&_h2]:font-semibold',
  '[&_h3]:text-[9pt] [&_h3]:font-semibold [&_p]:my-1 [&_ul]:my-1 [&_ul]:list-disc [&_ul]:pl-5',
  '[&_ol]:my-1 [&_ol]:list-decimal [&_ol]:pl-5 [&_code]:font-mono [&_code]:text-[8pt]',
  '[&_td]:border [&_td]:border-black/30 [&_td]:px-1 [&_th]:border [&_th]:border-black/30 [&_th]:px-1',
].join(' ');

/** A revision's status in the words printed on paper. */
export const STATUS: Record<string, string> = {
  in_check: 'In check',
  returned: 'Returned',
  checked: 'Checked',
  sealed: 'Sealed',
  superseded: 'Superseded',
};

const who = (p: { name: string } | null, at: string | null) =>
  p && at ? `${p.name}, ${formatUtc(at).slice(0, 10)}` : '—';

/** A name and a date in a narrow column: the date never breaks at its hyphens. */
function WhoWhen({ person, at }: { person: { name: string } | null; at: string | null }) {
  if (!person || !at) return <>—</>;
  return (
    <>
      {person.name}, <span className="whitespace-nowrap">{formatUtc(at).slice(0, 10)}</span>
    </>
  );
}

function TitleBlock({ pkg }: { pkg: PrintPackage }) {
  const r = pkg.revision;
  return (
    <div
      className="mb-3 grid grid-cols-4 border border-black text-[8.5pt]"
      aria-label="Title block"
      role="group"
    >
      <Cell label="Firm" value={pkg.firm.name} wide />
      <Cell label="Project" value={pkg.project.name} wide />
      <Cell label="Title" value={pkg.sheet.title} wide />
      <Cell label="Job no." value={pkg.project.jobNumber} />
      <Cell label="Sheet no." value={pkg.sheet.number} />
      <Cell label="Revision" value={`Rev ${r.number} — ${STATUS[r.status] ?? r.status}`} />
      <Cell label="Prepared by" value={who(r.preparedBy, r.preparedAt)} />
      <Cell label="Checked by" value={who(r.checkedBy, r.checkedAt)} />
      <Cell label="Sealed by" value={who(r.sealedBy, r.sealedAt)} />
    </div>
  );
}

function Cell({ label, value, wide = false }: { label: string; value: string; wide?: boolean }) {
  return (
    <div className={`border border-black/60 px-1.5 py-0.5 ${wide ? 'col-span-2' : ''}`}>
      <div className="text-[7pt] tracking-wide text-black/60 uppercase">{label}</div>
      <div className="font-medium">{value}</div>
    </div>
  );
}

/** A revision as a calculation package: print it from the browser to PDF. */
export function PrintView({
  revisionId,
  backHref,
  verifyUrl,
  remarks,
}: {
  revisionId: number;
  backHref: string;
  verifyUrl: (path: string) => string;
  /** The revision's check remarks, printed after the sheet. */
  remarks: PrintRemarks;
}) {
  const print = usePrint(revisionId);
  const fitRef = useFitToWidth();
  if (print.isPending) return <Spinner label="Composing the calculation package…" />;
  if (print.isError) {
    return <QueryError what="the package" error={print.error} onRetry={() => print.refetch()} />;
  }
  const pkg = print.data;
  const r = pkg.revision;

  return (
    <div ref={fitRef} className="mw-print mx-auto max-w-[210mm] bg-white p-6 shadow-sheet">
      {/* the page numbers sit in the page's margin, right above the title block of each page */}
      <style>{pageMarginCss(`${pkg.sheet.number} · Rev ${r.number}`)}</style>
      <div className="mw-no-print mb-4 flex flex-wrap items-center gap-3">
        <Link to={backHref} className="text-sm text-accent-strong hover:underline">
          ← Back to Rev {r.number}
        </Link>
        <Button onClick={() => window.print()}>Print or save as PDF</Button>
        <span className="text-xs text-ink-faint">
          The title block repeats on every page, with the sheet, revision and “Page x of y” above
          it.
        </span>
      </div>
      <RevisionPages
        pkg={pkg}
        verifyUrl={verifyUrl}
        record={<RemarksRecord revisionNumber={r.number} remarks={remarks} blocks={pkg.blocks} />}
      />
    </div>
  );
}

/**
 * One revision on paper: its title block repeated on every page, then the sheet, its caution
 * and its seal. The calculation package binds several of these; `sealMark` sits beside the seal
 * (the package's QR code) and `record`, the record of check remarks, follows the sheet.
 */
export function RevisionPages({
  pkg,
  verifyUrl,
  sealMark,
  record,
}: {
  pkg: PrintPackage;
  verifyUrl: (path: string) => string;
  sealMark?: ReactNode;
  record?: ReactNode;
}) {
  const r = pkg.revision;
  return (
    <>
      <table className="mw-package">
        <thead className="mw-title">
          <tr>
            <td>
              <TitleBlock pkg={pkg} />
            </td>
          </tr>
        </thead>
        <tbody>
          <tr>
            <td className="align-top">
              {r.banner ? (
                <p
                  role="note"
                  aria-label="Preliminary"
                  className="mb-3 border-2 border-black px-3 py-2 text-center text-[11pt] font-bold uppercase"
                >
                  Preliminary — not for construction
                  <span className="block text-[9pt] font-normal normal-case">
                    Purpose: {r.purpose}
                  </span>
                </p>
              ) : null}
              <h1 className="text-[14pt] font-semibold">
                {pkg.sheet.number} — {pkg.sheet.title}
              </h1>
              {pkg.sheet.subject ? <p className="mb-2">{pkg.sheet.subject}</p> : null}

              <h2 className="mt-3 mb-1 text-[11pt] font-semibold">Revision history</h2>
              <table className="w-full border-collapse text-[8.5pt]" aria-label="Revision history">
                <thead>
                  <tr className="border-b border-black text-left">
                    <th className="pr-2">Rev</th>
                    <th className="pr-2">Status</th>
                    <th className="pr-2">Purpose</th>
                    <th className="pr-2">Prepared</th>
                    <th className="pr-2">Checked</th>
                    <th className="pr-2">Sealed</th>
                    <th className="pr-2">Seal code</th>
                  </tr>
                </thead>
                <tbody>
                  {[...pkg.history]
                    .sort((a, b) => a.number - b.number)
                    .map((h) => (
                      <tr key={h.number} className="border-b border-black/30">
                        <td className="pr-2">{h.number}</td>
                        <td className="pr-2">{STATUS[h.status] ?? h.status}</td>
                        <td className="pr-2">{h.purpose}</td>
                        <td className="pr-2">
                          <WhoWhen person={h.issuedBy} at={h.issuedAt} />
                        </td>
                        <td className="pr-2">
                          <WhoWhen person={h.checkedBy} at={h.checkedAt} />
                        </td>
                        <td className="pr-2">
                          <WhoWhen person={h.sealedBy} at={h.sealedAt} />
                        </td>
                        <td className="pr-2 font-mono whitespace-nowrap">{h.sealCode ?? '—'}</td>
                      </tr>
                    ))}
                </tbody>
              </table>

              <h2 className="mt-4 mb-1 text-[11pt] font-semibold">Calculation</h2>
              {pkg.blocks.map((block, i) => {
                const result = pkg.results.blocks.find((b) => b.blockId === block.id);
                return (
                  <section
                    key={block.id}
                    className="mw-block mb-3 border-t border-black/40 pt-1"
                    aria-label={`Block ${i + 1} (${block.kind})`}
                  >
                    <p className="text-[7.5pt] text-black/60">
                      Block {i + 1} ({block.kind})
                    </p>
                    {block.kind === 'text' ? (
                      // Narrative reads as written, headings and formulas rendered; its source
                      // lines, for remarks, are on the revision.
                      <div
                        className={PRINTED_MARKDOWN}
                        dangerouslySetInnerHTML={{ __html: renderMarkdown(block.source) }}
                      />
                    ) : (
                      <pre className="font-mono text-[8pt] leading-snug whitespace-pre-wrap">
                        {block.source
                          .split('\n')
                          .map((l, n) => `${String(n + 1).padStart(3)}  ${l}`)
                          .join('\n')}
                      </pre>
                    )}
                    {result && result.kind !== 'text' ? (
                      <div className="mt-1">
                        <UnitSystemProvider system={unitSystemOf(pkg.settings)}>
                          <BlockResultView
                            result={result}
                            digits={pkg.results.significantFigures}
                          />
                        </UnitSystemProvider>
                      </div>
                    ) : null}
                  </section>
                );
              })}
              <p className="mt-2 text-[8.5pt]">
                Criteria: {pkg.results.summary.passed} pass, {pkg.results.summary.failed} fail
                {pkg.results.summary.errors > 0 ? `, ${pkg.results.summary.errors} errors` : ''}.
                Engine {r.engineVersion}.
              </p>

              {record}

              <p
                className="mt-3 border border-black/60 px-2 py-1 text-[8.5pt]"
                aria-label="Caution"
              >
                <strong>Caution. </strong>
                {pkg.caution}
              </p>

              {pkg.seal ? (
                <section
                  className="mw-seal mt-4 border-2 border-black px-3 py-2 text-[9pt]"
                  aria-label="Seal"
                >
                  <p className="text-[11pt] font-bold">Sealed</p>
                  <p>
                    {pkg.seal.principal.name}, licence {pkg.seal.principal.licenceNumber},{' '}
                    {pkg.seal.principal.jurisdiction}
                  </p>
                  <p>Sealed {formatUtc(pkg.seal.sealedAt)}</p>
                  <p>
                    Seal code <span className="font-mono font-bold">{pkg.seal.code}</span>
                  </p>
                  <p className="text-[7.5pt] break-all">
                    {DIGEST_WORDS.seal.label} <span className="font-mono">{pkg.seal.digest}</span> (
                    {DIGEST_WORDS.seal.covers})
                  </p>
                  <p>
                    Verify at <span className="font-mono">{verifyUrl(pkg.seal.verifyPath)}</span>
                  </p>
                  {sealMark}
                </section>
              ) : null}
            </td>
          </tr>
        </tbody>
      </table>
    </>
  );
}
