// The results of a response block: tables, the published method, the caution, and plots (loaded
// with the charts library when first shown). Shared by the editor, revisions, compare and print.
import { lazy, Suspense } from 'react';
import type {
  HarmonicResponseData,
  HistoryResponseData,
  ResponseBlockResult,
  SpectrumDirectionResult,
  SpectrumResponseData,
  WalkingResponseData,
} from '../../../../core/index';
import { percent, sig } from '../../lib/format';
import { useUnits } from './units';

const SpectrumPlot = lazy(() =>
  import('./response-plots').then((m) => ({ default: m.SpectrumPlot })),
);
const HarmonicPlot = lazy(() =>
  import('./response-plots').then((m) => ({ default: m.HarmonicPlot })),
);
const HistoryPlot = lazy(() =>
  import('./response-plots').then((m) => ({ default: m.HistoryPlot })),
);

const G = 9.80665;
const TH = 'border-b border-rule px-2 py-1 text-right font-semibold';
const TD = 'px-2 py-0.5 text-right font-mono tabular-nums';

function Table({ label, head, rows }: { label: string; head: string[]; rows: string[][] }) {
  return (
    <div className="max-w-full overflow-x-auto">
      <table className="text-xs" aria-label={label}>
        <thead>
          <tr>
            {head.map((h) => (
              <th key={h} scope="col" className={TH}>
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((row, i) => (
            <tr key={i} className="border-b border-rule/40">
              {row.map((c, j) => (
                <td key={j} className={TD}>
                  {c}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function Plot({ children }: { children: React.ReactNode }) {
  return (
    <div className="mt-2">
      <Suspense fallback={<p className="text-xs text-ink-faint">Drawing the plot…</p>}>
        {children}
      </Suspense>
    </div>
  );
}

function Direction({ d, several }: { d: SpectrumDirectionResult; several: boolean }) {
  const u = useUnits();
  const kN = (n: number) => u.text('force', n);
  const mm = (m: number) => u.text('displacement', m);
  return (
    <section
      className="flex flex-col gap-2"
      aria-label={`Spectrum analysis, direction ${d.direction}`}
    >
      <p className="text-sm">
        {several ? <strong>Direction {d.direction}: </strong> : null}
        Base shear {d.combination.toUpperCase()} <strong>{kN(d.baseShear)}</strong>
        {d.scaling && d.scaling.factor > 1
          ? `, scaled × ${sig(d.scaling.factor, 4)} to ${kN(d.scaledBaseShear)} (${sig(d.scaling.share * 100, 3)} % of V_ELF ${kN(d.scaling.elfBaseShear)})`
          : d.scaling
            ? ` ≥ ${sig(d.scaling.share * 100, 3)} % of V_ELF ${kN(d.scaling.elfBaseShear)}, no scaling`
            : ''}
        ; modes carry {percent(d.massRatio)} of the mass.
      </p>
      <p className="text-xs text-ink-soft">{d.description}</p>
      <Table
        label="Modal responses"
        head={['Mode', 'T (s)', 'ζ', `S_a (${u.unit('acceleration')})`, 'Γ', 'M*', 'V_n']}
        rows={d.modes.map((m) => [
          String(m.mode),
          sig(m.period, 4),
          sig(m.damping, 3),
          sig(u.value('acceleration', m.sa), 4),
          sig(u.value('rootMass', m.gamma), 4),
          u.text('mass', m.effectiveMass),
          kN(m.baseShear),
        ])}
      />
      {d.storeys ? (
        <Table
          label="Storey results"
          head={['Storey', 'Force', 'Shear', 'Overturning', 'Drift', 'Drift ratio', 'Displacement']}
          rows={d.storeys.force.map((_, i) => [
            String(i + 1),
            kN(d.storeys!.force[i]!),
            kN(d.storeys!.shear[i]!),
            u.text('moment', d.storeys!.overturning[i]!),
            mm(d.storeys!.drift[i]!),
            `${sig(d.storeys!.driftRatio[i]! * 100, 3)} %`,
            mm(d.displacement[i]!),
          ])}
        />
      ) : (
        <p className="text-xs">
          Peak displacements: {d.displacement.map((x, i) => `${i + 1}: ${mm(x)}`).join(' · ')}
        </p>
      )}
    </section>
  );
}

function Spectrum({ data }: { data: SpectrumResponseData }) {
  const u = useUnits();
  const mm = (m: number) => u.text('displacement', m);
  const several = data.directions.length > 1;
  return (
    <div className="flex flex-col gap-3">
      {data.directions.map((d) => (
        <Direction key={d.direction} d={d} several={several} />
      ))}
      {data.combined ? (
        <p className="text-xs">
          Directions combined by {data.combined.rule === 'srss' ? 'SRSS' : 'the 100 %/30 % rule'}:
          displacements {data.combined.displacement.map((x) => mm(x)).join(', ')}
          {data.combined.drift
            ? `; drifts ${data.combined.drift.map((x) => mm(x)).join(', ')}`
            : ''}
        </p>
      ) : null}
      <Plot>
        <SpectrumPlot data={data} />
      </Plot>
    </div>
  );
}

function Harmonic({ data }: { data: HarmonicResponseData }) {
  const u = useUnits();
  const mm = (m: number) => u.text('displacement', m);
  return (
    <div className="flex flex-col gap-2">
      <p className="text-sm">
        Load: {data.load}.
        {data.runningSpeed !== null
          ? ` Running speed ${sig(data.runningSpeed, 4)} Hz (${sig(data.runningSpeed * 60, 4)} rpm); nearest mode ${percent(data.separation)} away (±20 % band, ACI 351.3R, from memory).`
          : ''}
      </p>
      <Table
        label="Harmonic response"
        head={[
          'DOF',
          'Largest amplitude',
          'at',
          ...(data.atRunning ? ['At running speed', 'Velocity', 'Phase lag'] : []),
        ]}
        rows={data.dofs.map((d, i) => {
          const max = Math.max(...d.amplitude);
          const at = data.frequencies[d.amplitude.indexOf(max)] ?? 0;
          const run = data.atRunning?.[i];
          return [
            d.label,
            mm(max),
            `${sig(at, 4)} Hz`,
            ...(run
              ? [
                  mm(run.amplitude),
                  u.text('velocity', run.velocity),
                  `${sig((run.phase * 180) / Math.PI, 4)}°`,
                ]
              : []),
          ];
        })}
      />
      <Plot>
        <HarmonicPlot data={data} />
      </Plot>
    </div>
  );
}

function History({ data }: { data: HistoryResponseData }) {
  const u = useUnits();
  const mm = (m: number) => u.text('displacement', m);
  return (
    <div className="flex flex-col gap-2">
      <p className="text-sm">
        {data.steps.toLocaleString('en-GB')} steps of {sig(data.step, 4)} s (
        {data.method === 'exact'
          ? 'exact for a piecewise-linear load'
          : 'Newmark average acceleration'}
        ); central-difference stable step 2/ω_max = {sig(data.dtCr, 4)} s ({sig(data.dtCrDamped, 4)}{' '}
        s with damping).
      </p>
      <Table
        label="Peaks"
        head={['Response', 'Peak', 'Time of peak']}
        rows={[
          ...data.dofs.map((d) => [`Displacement ${d.label}`, mm(d.peak), `${sig(d.time, 4)} s`]),
          ...(data.baseShear
            ? [
                [
                  'Base shear',
                  u.text('force', data.baseShear.peak),
                  `${sig(data.baseShear.time, 4)} s`,
                ],
              ]
            : []),
        ]}
      />
      <Plot>
        <HistoryPlot data={data} />
      </Plot>
    </div>
  );
}

function Walking({ data }: { data: WalkingResponseData }) {
  const u = useUnits();
  const acc = (a: number, digits: number) => u.text('acceleration', a, digits);
  return (
    <div className="flex flex-col gap-2">
      <p className="text-sm">
        Mode {data.mode} at {sig(data.frequency, 4)} Hz, walker at {data.label}: peak acceleration{' '}
        <strong>{acc(data.acceleration, 3)}</strong> ({sig(data.ratio * 100, 3)} % g)
        {data.limit !== null ? (
          <>
            {' '}
            against the limit {acc(data.limit, 3)} ({sig((data.limit / G) * 100, 3)} % g):{' '}
            <span className={data.pass ? 'font-semibold text-pass' : 'font-semibold text-fail'}>
              {data.pass ? 'within' : 'exceeds'}
            </span>
          </>
        ) : null}
        .
      </p>
      <Table
        label="Walking response"
        head={['P_o', 'β', 'Modal mass', 'W', 'a_p', 'a_p/g']}
        rows={[
          [
            u.text('force', data.force),
            sig(data.damping, 3),
            u.text('mass', data.modalMass),
            u.text('force', data.weight),
            acc(data.acceleration, 4),
            `${sig(data.ratio * 100, 3)} %`,
          ],
        ]}
      />
    </div>
  );
}

/** A response block's results with its method and the caution; nothing before it has run. */
export function ResponseResults({ result }: { result: ResponseBlockResult }) {
  if (!result.ok) return null;
  return (
    <div className="flex flex-col gap-2" aria-label={`Response ${result.name ?? ''}`}>
      {result.spectrum ? <Spectrum data={result.spectrum} /> : null}
      {result.harmonic ? <Harmonic data={result.harmonic} /> : null}
      {result.history ? <History data={result.history} /> : null}
      {result.walking ? <Walking data={result.walking} /> : null}
      {result.notes.length > 0 ? (
        <ul className="list-disc pl-5 text-xs text-ink-soft">
          {result.notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      ) : null}
      {result.method ? <p className="text-xs text-ink-soft">Method: {result.method}.</p> : null}
      <p
        role="note"
        className="rounded-sm border border-rule bg-paper-sheet px-2 py-1 text-xs text-ink-soft"
      >
        {result.caution}
      </p>
    </div>
  );
}
