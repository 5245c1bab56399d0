import type { ModesBlockResult } from '../api/results';
import { Table, Td, Th } from '../../../components/ui/table';
import { percent, sig } from '../lib/format';
import { ConvergencePlot, ModeShapePlot } from './modes-plots';

/** The modes table, the Sturm check, warnings and the two plots of one eigen-solve. */
export function ModesResult({ result, digits }: { result: ModesBlockResult; digits: number }) {
  const name = result.name ?? 'modes';
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
        <Table caption={`Modes of ${name}`}>
          <thead>
            <tr>
              <Th className="text-right">Mode</Th>
              <Th className="text-right">f (Hz)</Th>
              <Th className="text-right">T (s)</Th>
              <Th className="text-right">ω (rad/s)</Th>
              <Th className="text-right">Γ</Th>
              <Th className="text-right">Eff. mass</Th>
              <Th className="text-right">Cumulative</Th>
              <Th className="text-right">Backward error</Th>
              <Th className="text-right">Iterations</Th>
            </tr>
          </thead>
          <tbody className="num">
            {result.modes.map((m) => (
              <tr key={m.mode}>
                <Td className="py-1 text-right">{m.mode}</Td>
                <Td className="py-1 text-right">{sig(m.frequency, digits)}</Td>
                <Td className="py-1 text-right">{sig(m.period, digits)}</Td>
                <Td className="py-1 text-right">{sig(m.omega, digits)}</Td>
                <Td className="py-1 text-right">{sig(m.gamma, digits)}</Td>
                <Td className="py-1 text-right">{percent(m.ratio)}</Td>
                <Td className="py-1 text-right">{percent(m.cumulative)}</Td>
                <Td className="py-1 text-right">
                  {m.backwardError === null ? '—' : m.backwardError.toExponential(1)}
                </Td>
                <Td className="py-1 text-right">{m.iterations ?? '—'}</Td>
              </tr>
            ))}
          </tbody>
        </Table>
      ) : null}
      {result.sturm ? (
        <p className={result.sturm.missed ? 'text-fail' : 'text-pass'}>
          Sturm check at σ = {sig(result.sturm.shift, digits)} 1/s²: {result.sturm.count} eigenvalue
          {result.sturm.count === 1 ? '' : 's'} below the shift, {result.sturm.found} found —{' '}
          {result.sturm.missed ? 'a mode was missed.' : 'no mode missed.'}
        </p>
      ) : null}
      {result.criticalTimeStep !== null ? (
        <p>Critical time step Δt_cr = 2/ω_max = {sig(result.criticalTimeStep, digits)} s</p>
      ) : null}
      {result.warnings.length > 0 ? (
        <ul className="list-disc pl-5 text-[#8a4b12]" aria-label="Warnings">
          {result.warnings.map((w, i) => (
            <li key={i}>{w}</li>
          ))}
        </ul>
      ) : null}
      {(result.shapes && result.shapes.length > 0) || result.histories.length > 0 ? (
        <div className="flex flex-col gap-4 md:flex-row">
          {result.shapes && result.shapes.length > 0 ? (
            <ModeShapePlot shapes={result.shapes} count={result.modes.length} />
          ) : null}
          {result.histories.length > 0 ? <ConvergencePlot histories={result.histories} /> : null}
        </div>
      ) : null}
    </div>
  );
}
