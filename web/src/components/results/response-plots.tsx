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
import { useUnits, type Units } from './units';

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

interface Series {
  key: string;
  name: string;
}

/**
 * One line chart of the response plots: x against one or more series, with the axis label, the
 * unit of the values for the tooltip, and any marks (reference lines, a band) drawn under them.
 */
function XYChart({
  label,
  points,
  x,
  xLabel,
  xText,
  unit,
  series,
  marks,
}: {
  label: string;
  points: Record<string, number>[];
  x: string;
  xLabel: string;
  xText: (v: number) => string;
  unit: string;
  series: Series[];
  marks?: React.ReactNode;
}) {
  return (
    <Frame label={label}>
      <LineChart data={points} margin={{ top: 14, right: 12, bottom: 14, left: 0 }}>
        <CartesianGrid stroke={GRID} strokeDasharray="2 3" />
        <XAxis
          type="number"
          dataKey={x}
          domain={['dataMin', 'dataMax']}
          tick={tick}
          tickFormatter={(v: number) => sig(v, 3)}
          label={{ value: xLabel, position: 'insideBottom', offset: -8, fontSize: 11 }}
        />
        <YAxis tick={tick} width={48} tickFormatter={(v: number) => sig(v, 3)} />
        <Tooltip
          formatter={(v) => `${sig(Number(v), 4)} ${unit}`}
          labelFormatter={(l) => xText(Number(l))}
        />
        {series.length > 1 ? <Legend wrapperStyle={{ fontSize: 11, paddingTop: 14 }} /> : null}
        {marks}
        {series.map((s, j) => (
          <Line
            key={s.key}
            dataKey={s.key}
            name={s.name}
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

/** S_a(T) in the page's acceleration unit, with a dashed line at each mode's period. */
export function SpectrumPlot({ data }: { data: SpectrumResponseData }) {
  const u = useUnits();
  const acc = u.unit('acceleration');
  return (
    <XYChart
      label="Design spectrum, modes' periods marked"
      points={data.curve.map(([T, sa]) => ({ T, sa: u.value('acceleration', sa) }))}
      x="T"
      xLabel="Period T (s)"
      xText={(T) => `T = ${sig(T, 3)} s`}
      unit={acc}
      series={[{ key: 'sa', name: `S_a (${acc})` }]}
      marks={data.periods.map((T, i) => (
        <ReferenceLine
          key={i}
          x={T}
          stroke={MARK}
          strokeDasharray="4 3"
          label={{ value: `${i + 1}`, position: 'top', fontSize: 10, fill: MARK }}
        />
      ))}
    />
  );
}

/** Per-DOF series of a plot, displacements in the page's unit (mm or in). */
function dofSeries(
  xs: readonly number[],
  x: string,
  dofs: readonly { label: string; values: readonly number[] }[],
  u: Units,
) {
  const unit = u.unit('displacement');
  const points = xs.map((v, i) => {
    const p: Record<string, number> = { [x]: v };
    dofs.forEach((d, j) => (p[`d${j}`] = u.value('displacement', d.values[i] ?? 0)));
    return p;
  });
  return {
    points,
    series: dofs.map((d, j) => ({ key: `d${j}`, name: `${d.label} (${unit})` })),
    unit,
  };
}

/** Displacement amplitude against frequency (Hz), running speed and ±20 % band marked. */
export function HarmonicPlot({ data }: { data: HarmonicResponseData }) {
  const u = useUnits();
  const { points, series, unit } = dofSeries(
    data.frequencies,
    'f',
    data.dofs.map((d) => ({ label: d.label, values: d.amplitude })),
    u,
  );
  const run = data.runningSpeed;
  return (
    <XYChart
      label="Amplitude against frequency, running speed ±20 % marked"
      points={points}
      x="f"
      xLabel="Frequency (Hz)"
      xText={(f) => `${sig(f, 4)} Hz`}
      unit={unit}
      series={series}
      marks={[
        ...(run !== null
          ? [
              <ReferenceArea
                key="band"
                x1={0.8 * run}
                x2={1.2 * run}
                fill={MARK}
                fillOpacity={0.08}
              />,
              <ReferenceLine
                key="run"
                x={run}
                stroke={MARK}
                label={{ value: 'running', position: 'top', fontSize: 10, fill: MARK }}
              />,
            ]
          : []),
        ...data.modeFrequencies.map((f, i) => (
          <ReferenceLine key={`m${i}`} x={f} stroke="#4a4f57" strokeDasharray="2 3" />
        )),
      ]}
    />
  );
}

/** Displacements and, under ground motion, base shear against time, in the page's units. */
export function HistoryPlot({ data }: { data: HistoryResponseData }) {
  const u = useUnits();
  const force = u.unit('force');
  const { points, series, unit } = dofSeries(
    data.time,
    't',
    data.dofs.map((d) => ({ label: d.label, values: d.displacement })),
    u,
  );
  const time = (t: number) => `t = ${sig(t, 4)} s`;
  return (
    <div className="flex flex-wrap gap-4">
      <XYChart
        label="Displacement against time"
        points={points}
        x="t"
        xLabel="Time (s)"
        xText={time}
        unit={unit}
        series={series}
      />
      {data.baseShear ? (
        <XYChart
          label="Base shear against time"
          points={data.time.map((t, i) => ({
            t,
            v: u.value('force', data.baseShear!.values[i] ?? 0),
          }))}
          x="t"
          xLabel="Time (s)"
          xText={time}
          unit={force}
          series={[{ key: 'v', name: `Base shear (${force})` }]}
        />
      ) : null}
    </div>
  );
}
