// Read-only renderings of one block's frozen results (a revision, a comparison, a print). The
// editor has its own live renderers inside its feature; these stay small and print-friendly.
import type {
  BlockResult,
  CalcBlockResult,
  CriteriaBlockResult,
  MatrixBlockResult,
  ModesBlockResult,
} from '../../../../core/index';
import { lazy, Suspense } from 'react';
import { participationFactor, percent, sig } from '../../lib/format';
import { ModesDownloads } from './modes-downloads';
import { ModesWarnings } from './modes-warnings';
import { ParticipationNote } from './participation-note';
import { ResponseResults } from './response-results';
import { CalcLineTex } from './calc-line';
import { CriterionValues } from './criterion-values';
import { MatrixEntriesTable } from './matrix-entries-table';
import { useUnits } from './units';
import { shapeRows } from './shape-rows';

export type { BlockResult, SheetResults } from '../../../../core/index';

// The charts library is large: fetched when a revision with mode shapes is shown.
const ModeShapePlot = lazy(() =>
  import('./modes-plots').then((m) => ({ default: m.ModeShapePlot })),
);

function CalcLines({ result, digits }: { result: CalcBlockResult; digits: number }) {
  const units = useUnits();
  if (result.lines.length === 0) return null;
  return (
    <ol className="divide-y divide-rule/60" aria-label="Calculation results">
      {result.lines.map((line) => (
        <li key={line.line} className="flex flex-wrap items-baseline justify-between gap-x-4 py-1">
          <span className="relative min-w-0 overflow-x-auto">
            <span className="mr-2 font-mono text-xs text-ink-faint">{line.line}</span>
            <CalcLineTex line={line} system={units.system} digits={digits} />
          </span>
          {line.comment ? (
            <span className="min-w-0 text-xs text-ink-faint">{line.comment}</span>
          ) : null}
        </li>
      ))}
    </ol>
  );
}

function Criteria({ result, digits }: { result: CriteriaBlockResult; digits: number }) {
  const units = useUnits();
  return (
    <ul className="flex flex-col gap-1" aria-label="Criteria">
      {result.criteria.map((c) => (
        <li key={c.line} className="flex items-baseline gap-3 text-sm">
          <span
            className={`inline-block w-14 shrink-0 rounded-sm border px-1 text-center text-xs font-semibold ${
              c.pass ? 'border-pass bg-pass-soft text-pass' : 'border-fail bg-fail-soft text-fail'
            }`}
          >
            {c.pass ? 'Passed' : 'Failed'}
          </span>
          <span>{c.label}</span>
          <CriterionValues criterion={c} system={units.system} digits={digits} />
        </li>
      ))}
    </ul>
  );
}

function Matrix({ result, digits }: { result: MatrixBlockResult; digits: number }) {
  const value = result.value?.type === 'matrix' ? result.value : null;
  return (
    <>
      <p className="text-sm text-ink-soft">
        {result.name ?? 'Matrix'}: {result.rows} × {result.cols}
        {result.unit ? ` in ${result.unit}` : ''},{' '}
        {result.origin === 'upload' ? 'from a file' : 'typed'},{' '}
        {result.storage === 'sparse' && result.nonzeros !== undefined
          ? `sparse (${result.nonzeros.toLocaleString('en-GB')} nonzeros), `
          : ''}
        {result.symmetric ? 'symmetric' : 'not symmetric'}
        {result.asymmetry
          ? ` (worst at row ${result.asymmetry.row}, column ${result.asymmetry.col}, relative ${result.asymmetry.relative.toExponential(2)})`
          : ''}
      </p>
      {value && !value.values ? (
        <MatrixEntriesTable name={result.name ?? 'matrix'} value={value} digits={digits} />
      ) : null}
    </>
  );
}

function Modes({ result, fileStem }: { result: ModesBlockResult; fileStem?: string }) {
  const units = useUnits();
  const gammas = result.modes.map((o) => units.value('rootMass', o.gamma ?? Number.NaN));
  const rows = shapeRows(result);
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-sm" aria-label={`Modes ${result.name ?? ''}`}>
        <thead>
          <tr className="border-b border-rule text-left text-xs text-ink-soft">
            <th className="py-1 pr-3">Mode</th>
            <th className="py-1 pr-3">f (Hz)</th>
            <th className="py-1 pr-3">T (s)</th>
            <th className="py-1 pr-3">ω (rad/s)</th>
            <th
              className="py-1 pr-3"
              title="Participation factor φᵀMr, with φ mass-normalized (φᵀMφ = 1 kg)"
            >
              Γ ({units.unit('rootMass')})
            </th>
            <th className="py-1 pr-3">Eff. mass</th>
            <th className="py-1 pr-3">Cumulative</th>
            <th className="py-1 pr-3">Backward error</th>
          </tr>
        </thead>
        <tbody>
          {result.modes.map((m) => (
            <tr key={m.mode} className="border-b border-rule/60 font-mono text-xs">
              <td className="py-1 pr-3">{m.mode}</td>
              <td className="py-1 pr-3">{sig(m.frequency)}</td>
              <td className="py-1 pr-3">{sig(m.period)}</td>
              <td className="py-1 pr-3">{sig(m.omega)}</td>
              <td className="py-1 pr-3">
                {participationFactor(
                  m.gamma === null ? null : units.value('rootMass', m.gamma),
                  gammas,
                )}
              </td>
              <td className="py-1 pr-3">{percent(m.ratio)}</td>
              <td className="py-1 pr-3">{percent(m.cumulative)}</td>
              <td className="py-1 pr-3">
                {m.backwardError === null ? '—' : m.backwardError.toExponential(1)}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <ParticipationNote result={result} />
      {result.methodUsed ? (
        <p className="mt-1 text-xs text-ink-faint">
          Method: {result.methodUsed}
          {result.size !== null ? `, ${result.size} degrees of freedom` : ''}
          {result.sturm
            ? `; Sturm count ${result.sturm.count} below the shift, ${result.sturm.found} found${result.sturm.missed ? ' — modes missed' : ''}`
            : ''}
        </p>
      ) : null}
      <div className="mt-1 flex flex-col gap-1">
        <ModesWarnings result={result} compact />
        {fileStem ? <ModesDownloads result={result} fileStem={fileStem} /> : null}
      </div>
      {rows ? (
        <div className="mt-2 max-w-xl break-inside-avoid">
          <Suspense fallback={<p className="text-xs text-ink-faint">Drawing the mode shapes…</p>}>
            <ModeShapePlot
              shapes={rows.shapes}
              count={result.modes.length}
              dofLabels={rows.labels}
              rowDofs={rows.dofs}
            />
          </Suspense>
        </div>
      ) : null}
    </div>
  );
}

/**
 * The frozen results of one block; nothing for a text block. With `fileStem`, a modes block offers
 * its table and shapes as CSV files so named ("DYN-01_Rev2" gives DYN-01_Rev2_deck_v_modes.csv);
 * without it (print, compare), no downloads.
 */
export function BlockResultView({
  result,
  fileStem,
  digits = 4,
}: {
  result: BlockResult | undefined;
  fileStem?: string;
  /** Significant figures of converted results (the sheet's setting). */
  digits?: number;
}) {
  if (!result) return null;
  switch (result.kind) {
    case 'calc':
      return <CalcLines result={result} digits={digits} />;
    case 'criteria':
      return <Criteria result={result} digits={digits} />;
    case 'matrix':
      return <Matrix result={result} digits={digits} />;
    case 'modes':
      return (
        <Modes
          result={result}
          {...(fileStem ? { fileStem: `${fileStem}_${result.name ?? 'modes'}` } : {})}
        />
      );
    case 'response':
      return <ResponseResults result={result} />;
    default:
      return null;
  }
}
