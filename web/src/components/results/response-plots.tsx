// Plots of a response block: the spectrum with the modes' periods marked, the amplitude against
// frequency with the running speed and its ±20 % band, and histories against time.
import {
  CartesianGrid,
  Legend,
  Line,
  LineChart,
  ReferenceArea,
  ReferenceLine,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from 'recharts';
import type {
  HarmonicResponseData,
  HistoryResponseData,
  SpectrumResponseData,
} from '../../../../core/index';
import { sig } from '../../lib/format';
import { SERIES_COLOURS } from './modes-plots';

const GRID = '#d6cfbf';
const MARK = '#8a4b12';
const tick = { fontSize: 11 };

function Frame({ label, children }: { label: string; children: React.ReactElement }) {
  return (
    <figure className="min-w-0 max-w-xl flex-1 break-inside-avoid" aria-label={label}>
      <figcaption className="mb-1 text-xs font-semibold tracking-wide text-ink-soft uppercase">
        {label}
      </figcaption>
      <div style={{ height: 220 }}>
        <ResponsiveContainer width="100%" height="100%">
          {children}
        </ResponsiveContainer>
      </div>
    </figure>
  );
}

/** S_a(T) in m/s² with a dashed line at each mode's period. */
export function SpectrumPlot({ data }: { data: SpectrumResponseData }) {
  const points = data.curve.map(([T, sa]) => ({ T, sa }));
  return (
    <Frame label="Design spectrum, modes' periods marked">
      <LineChart data={points} margin={{ top: 8, right: 12, bottom: 14, left: 0 }}>
        <CartesianGrid stroke={GRID} strokeDasharray="2 3" />
        <XAxis
          type="number"
          dataKey="T"
          domain={[0, 'dataMax']}
          tick={tick}
          label={{ value: 'Period T (s)', position: 'insideBottom', offset: -8, fontSize: 11 }}
        />
        <YAxis tick={tick} width={44} tickFormatter={(v: number) => sig(v, 3)} />
        <Tooltip
          formatter={(v) => `${sig(Number(v), 4)} m/s²`}
          labelFormatter={(l) => `T = ${sig(Number(l), 3)} s`}
        />
        {data.periods.map((T, i) => (
          <ReferenceLine
            key={i}
            x={T}
            stroke={MARK}
            strokeDasharray="4 3"
            label={{ value: `${i + 1}`, position: 'top', fontSize: 10, fill: MARK }}
          />
        ))}
        <Line
          dataKey="sa"
          name="S_a (m/s²)"
          stroke={SERIES_COLOURS[0]}
          dot={false}
          isAnimationActive={false}
          strokeWidth={1.5}
        />
      </LineChart>
    </Frame>
  );
}

/** Displacement amplitude (mm) against frequency (Hz), running speed and ±20 % band marked. */
export function HarmonicPlot({ data }: { data: HarmonicResponseData }) {
  const points = data.frequencies.map((f, i) => {
    const p: Record<string, number> = { f };
    data.dofs.forEach((d, j) => (p[`d${j}`] = (d.amplitude[i] ?? 0) * 1000));
    return p;
  });
  const run = data.runningSpeed;
  return (
    <Frame label="Amplitude against frequency, running speed ±20 % marked">
      <LineChart data={points} margin={{ top: 8, right: 12, bottom: 14, left: 0 }}>
        <CartesianGrid stroke={GRID} strokeDasharray="2 3" />
        <XAxis
          type="number"
          dataKey="f"
          domain={['dataMin', 'dataMax']}
          tick={tick}
          tickFormatter={(v: number) => sig(v, 3)}
          label={{ value: 'Frequency (Hz)', position: 'insideBottom', offset: -8, fontSize: 11 }}
        />
        <YAxis tick={tick} width={48} tickFormatter={(v: number) => sig(v, 3)} />
        <Tooltip
          formatter={(v) => `${sig(Number(v), 4)} mm`}
          labelFormatter={(l) => `${sig(Number(l), 4)} Hz`}
        />
        <Legend wrapperStyle={{ fontSize: 11, paddingTop: 14 }} />
        {run !== null ? (
          <ReferenceArea x1={0.8 * run} x2={1.2 * run} fill={MARK} fillOpacity={0.08} />
        ) : null}
        {run !== null ? (
          <ReferenceLine
            x={run}
            stroke={MARK}
            label={{ value: 'running', position: 'top', fontSize: 10, fill: MARK }}
          />
        ) : null}
        {data.modeFrequencies.map((f, i) => (
          <ReferenceLine key={i} x={f} stroke="#4a4f57" strokeDasharray="2 3" />
        ))}
        {data.dofs.map((d, j) => (
          <Line
            key={d.dof}
            dataKey={`d${j}`}
            name={`${d.label} (mm)`}
            stroke={SERIES_COLOURS[j % SERIES_COLOURS.length]}
            dot={false}
            isAnimationActive={false}
            strokeWidth={1.5}
          />
        ))}
      </LineChart>
    </Frame>
  );
}

/** Displacements (mm) and, under ground motion, base shear (kN) against time. */
export function HistoryPlot({ data }: { data: HistoryResponseData }) {
  const points = data.time.map((t, i) => {
    const p: Record<string, number> = { t };
    data.dofs.forEach((d, j) => (p[`d${j}`] = (d.displacement[i] ?? 0) * 1000));
    return p;
  });
  const shear = data.baseShear
    ? data.time.map((t, i) => ({ t, v: (data.baseShear!.values[i] ?? 0) / 1000 }))
    : null;
  return (
    <div className="flex flex-wrap gap-4">
      <Frame label="Displacement against time">
        <LineChart data={points} margin={{ top: 8, right: 12, bottom: 14, left: 0 }}>
          <CartesianGrid stroke={GRID} strokeDasharray="2 3" />
          <XAxis
            type="number"
            dataKey="t"
            domain={[0, 'dataMax']}
            tick={tick}
            label={{ value: 'Time (s)', position: 'insideBottom', offset: -8, fontSize: 11 }}
          />
          <YAxis tick={tick} width={48} tickFormatter={(v: number) => sig(v, 3)} />
          <Tooltip
            formatter={(v) => `${sig(Number(v), 4)} mm`}
            labelFormatter={(l) => `t = ${sig(Number(l), 4)} s`}
          />
          <Legend wrapperStyle={{ fontSize: 11, paddingTop: 14 }} />
          {data.dofs.map((d, j) => (
            <Line
              key={d.dof}
              dataKey={`d${j}`}
              name={`${d.label} (mm)`}
              stroke={SERIES_COLOURS[j % SERIES_COLOURS.length]}
              dot={false}
              isAnimationActive={false}
              strokeWidth={1.2}
            />
          ))}
        </LineChart>
      </Frame>
      {shear ? (
        <Frame label="Base shear against time">
          <LineChart data={shear} margin={{ top: 8, right: 12, bottom: 14, left: 0 }}>
            <CartesianGrid stroke={GRID} strokeDasharray="2 3" />
            <XAxis
              type="number"
              dataKey="t"
              domain={[0, 'dataMax']}
              tick={tick}
              label={{ value: 'Time (s)', position: 'insideBottom', offset: -8, fontSize: 11 }}
            />
            <YAxis tick={tick} width={48} tickFormatter={(v: number) => sig(v, 3)} />
            <Tooltip
              formatter={(v) => `${sig(Number(v), 4)} kN`}
              labelFormatter={(l) => `t = ${sig(Number(l), 4)} s`}
            />
            <Line
              dataKey="v"
              name="Base shear (kN)"
              stroke={SERIES_COLOURS[1]}
              dot={false}
              isAnimationActive={false}
              strokeWidth={1.2}
            />
          </LineChart>
        </Frame>
      ) : null}
    </div>
  );
}
