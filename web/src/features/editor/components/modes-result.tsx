import { lazy, Suspense } from 'react';
import type { ModesBlockResult } from '../api/results';
import {
  ModeShapesTable,
  ModesDownloads,
  ModesWarnings,
  ParticipationNote,
  shapeRows,
} from '../../../components/results';
import { Table, Td, Th } from '../../../components/ui/table';
import { participationFactor, percent, sig } from '../../../lib/format';
import { Spinner } from '../../../components/ui/spinner';
import { useUnits } from '../../../components/results/units';

// The charts library is the largest part of the editor: fetched when the first plot is drawn, so a
// sheet without modes (or still evaluating) opens without it.
const ModeShapePlot = lazy(() =>
  import('../../../components/results/modes-plots').then((m) => ({ default: m.ModeShapePlot })),
);
const ConvergencePlot = lazy(() =>
  import('../../../components/results/modes-plots').then((m) => ({ default: m.ConvergencePlot })),
);

/**
 * Δt_cr = 2/ω_max is for explicit integration: it belongs where the author asked for the highest
 * mode (forward iteration) or for every mode of the model, not under every floor-frequency solve.
 */
export function showsCriticalTimeStep(
  result: Pick<ModesBlockResult, 'method' | 'methodUsed' | 'size' | 'modes'>,
): boolean {
  if (result.method === 'forward' || result.methodUsed === 'forward') return true;
  return result.size !== null && result.size > 0 && result.modes.length >= result.size;
}

/**
 * The modes table, the Sturm check, warnings (and the conditioning note, which is information)
 * and the two plots of one eigen-solve.
 */
export function ModesResult({
  result,
  digits,
  fileStem,
}: {
  result: ModesBlockResult;
  digits: number;
  /** Names the CSV files ("DYN-03_draft_vert"). */
  fileStem: string;
}) {
  const name = result.name ?? 'modes';
  // A direct solve has no iteration history: no empty chart for it.
  const iterated = result.histories.some((h) => h.length > 0);
  const units = useUnits();
  const gammas = result.modes.map((o) => units.value('rootMass', o.gamma ?? Number.NaN));
  const rows = shapeRows(result);
  return (
    <div className="flex flex-col gap-3 text-sm">
      <p className="text-ink-soft">
        <span className="font-mono font-semibold text-ink">{name}</span>
        {result.size !== null ? ` — ${result.size} degrees of freedom` : null}
        {result.methodUsed ? `, solved by ${result.methodUsed}` : null}
        {result.method && result.methodUsed && result.method !== result.methodUsed
          ? ` (asked: ${result.method})`
          : null}
      </p>
      {result.modes.length > 0 ? (
        <Table caption={`Modes of ${name}`} scrollable>
          <thead>
            <tr>
              <Th caps={false} className="text-right">
                Mode
              </Th>
              <Th caps={false} className="text-right">
                f (Hz)
              </Th>
              <Th caps={false} className="text-right">
                T (s)
              </Th>
              <Th caps={false} className="text-right">
                ω (rad/s)
              </Th>
              <Th
                caps={false}
                className="text-right"
                title="Participation factor φᵀMr, with φ mass-normalized (φᵀMφ = 1 kg)"
              >
                Γ ({units.unit('rootMass')})
              </Th>
              <Th caps={false} className="text-right">
                Eff. mass
              </Th>
              <Th caps={false} className="text-right">
                Cumulative
              </Th>
              <Th caps={false} className="text-right">
                Backward error
              </Th>
              <Th caps={false} className="text-right">
                Iterations
              </Th>
            </tr>
          </thead>
          <tbody className="num whitespace-nowrap">
            {result.modes.map((m) => (
              <tr key={m.mode}>
                <Td className="py-1 text-right">{m.mode}</Td>
                <Td className="py-1 text-right">{sig(m.frequency, digits)}</Td>
                <Td className="py-1 text-right">{sig(m.period, digits)}</Td>
                <Td className="py-1 text-right">{sig(m.omega, digits)}</Td>
                <Td className="py-1 text-right">
                  {participationFactor(
                    m.gamma === null ? null : units.value('rootMass', m.gamma),
                    gammas,
                    digits,
                  )}
                </Td>
                <Td className="py-1 text-right">{percent(m.ratio)}</Td>
                <Td className="py-1 text-right">{percent(m.cumulative)}</Td>
                <Td className="py-1 text-right">
                  {m.backwardError === null ? '—' : m.backwardError.toExponential(1)}
                </Td>
                {/* A direct method (dense) takes no iterations: a dash, not a 0. */}
                <Td className="py-1 text-right">{m.iterations ? m.iterations : '—'}</Td>
              </tr>
            ))}
          </tbody>
        </Table>
      ) : null}
      {result.modes.length > 0 ? <ParticipationNote result={result} /> : null}
      {result.sturm ? (
        <p className={result.sturm.missed ? 'text-fail' : 'text-pass'}>
          Sturm check at σ = {sig(result.sturm.shift, digits)} (rad/s)²
          {result.sturm.shift > 0
            ? ` (${sig(Math.sqrt(result.sturm.shift) / (2 * Math.PI), digits)} Hz)`
            : ''}
          : {result.sturm.count} eigenvalue
          {result.sturm.count === 1 ? '' : 's'} below the shift, {result.sturm.found} found —{' '}
          {result.sturm.missed ? 'a mode was missed.' : 'no mode missed.'}
        </p>
      ) : null}
      {result.criticalTimeStep !== null && showsCriticalTimeStep(result) ? (
        <p>
          Critical time step Δt<sub>cr</sub> = 2/ω<sub>max</sub> ={' '}
          <span className="num">{sig(result.criticalTimeStep, digits)}</span> s
        </p>
      ) : null}
      <ModesWarnings result={result} />
      <ModesDownloads result={result} fileStem={fileStem} />
      {rows || iterated ? (
        <Suspense fallback={<Spinner label="Drawing the plots…" />}>
          <div className="flex flex-col gap-4 md:flex-row">
            {rows ? (
              <ModeShapePlot
                shapes={rows.shapes}
                count={result.modes.length}
                dofLabels={rows.labels}
                rowDofs={rows.dofs}
              />
            ) : null}
            {iterated ? <ConvergencePlot histories={result.histories} /> : null}
          </div>
        </Suspense>
      ) : null}
      <ModeShapesTable result={result} digits={digits} />
    </div>
  );
}
