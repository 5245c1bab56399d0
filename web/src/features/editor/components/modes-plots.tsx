import { useState } from 'react';
import {
  CartesianGrid,
  Legend,
  Line,
  LineChart,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from 'recharts';
import { sig } from '../lib/format';

export const SERIES_COLOURS = ['#1f6b5c', '#8a4b12', '#5b3f8c', '#a3261b', '#4a4f57', '#2d6a2f'];
const MAX_SHAPES = 6;

/**
 * Mode shapes against the degree of freedom, drawn upwards (DOF 1 at the bottom) so a storey
 * chain reads like the building. Only the first six modes are drawn.
 */
export function ModeShapePlot({ shapes, count }: { shapes: number[][]; count: number }) {
  const modes = Math.min(count, MAX_SHAPES, shapes[0]?.length ?? 0);
  // Each shape scaled to a largest component of 1 for the drawing (the table keeps the
  // normalization asked for).
  const scale = Array.from({ length: modes }, (_, j) => {
    const max = Math.max(...shapes.map((row) => Math.abs(row[j] ?? 0)));
    return max > 0 ? 1 / max : 1;
  });
  const data = shapes.map((row, i) => {
    const point: Record<string, number> = { dof: i + 1 };
    for (let j = 0; j < modes; j++) point[`m${j + 1}`] = (row[j] ?? 0) * (scale[j] ?? 1);
    return point;
  });
  return (
    <figure className="min-w-0 flex-1" aria-label="Mode shapes">
      <figcaption className="mb-1 text-xs font-semibold tracking-wide text-ink-soft uppercase">
        Mode shapes{' '}
        <span className="font-normal normal-case">(each scaled to a largest value of 1)</span>
      </figcaption>
      <div style={{ height: 240 }}>
        <ResponsiveContainer width="100%" height="100%">
          <LineChart
            data={data}
            layout="vertical"
            margin={{ top: 4, right: 12, bottom: 4, left: 0 }}
          >
            <CartesianGrid stroke="#d6cfbf" strokeDasharray="2 3" />
            <XAxis
              type="number"
              domain={[-1, 1]}
              ticks={[-1, -0.5, 0, 0.5, 1]}
              tick={{ fontSize: 11 }}
              tickFormatter={(v: number) => sig(v, 2)}
            />
            <YAxis
              type="number"
              dataKey="dof"
              domain={[1, Math.max(1, data.length)]}
              allowDecimals={false}
              reversed
              tick={{ fontSize: 11 }}
              width={32}
              label={{ value: 'DOF', angle: -90, position: 'insideLeft', fontSize: 11 }}
            />
            <Tooltip
              formatter={(v) => sig(Number(v), 4)}
              labelFormatter={(l) => `DOF ${String(l)}`}
            />
            <Legend wrapperStyle={{ fontSize: 11 }} />
            {Array.from({ length: modes }, (_, j) => (
              <Line
                key={j}
                dataKey={`m${j + 1}`}
                name={`Mode ${j + 1}`}
                stroke={SERIES_COLOURS[j % SERIES_COLOURS.length]}
                dot={data.length <= 30}
                isAnimationActive={false}
                strokeWidth={1.5}
              />
            ))}
          </LineChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}

/** The Rayleigh quotient ρ against the iteration, for one mode at a time. */
export function ConvergencePlot({ histories }: { histories: number[][] }) {
  const [mode, setMode] = useState(0);
  const history = histories[mode] ?? [];
  const data = history.map((rho, i) => ({ iteration: i + 1, rho }));
  return (
    <figure className="min-w-0 flex-1" aria-label="Convergence">
      <figcaption className="mb-1 flex items-center justify-between gap-2 text-xs font-semibold tracking-wide text-ink-soft uppercase">
        <span>
          Convergence of <span className="normal-case">ρ</span>
        </span>
        {histories.length > 1 ? (
          <label className="flex items-center gap-1 font-normal normal-case">
            Mode
            <select
              className="rounded-sm border border-rule-strong bg-paper-sheet px-1 py-0.5 text-xs"
              value={mode}
              onChange={(e) => setMode(Number(e.target.value))}
            >
              {histories.map((_, i) => (
                <option key={i} value={i}>
                  {i + 1}
                </option>
              ))}
            </select>
          </label>
        ) : null}
      </figcaption>
      <div style={{ height: 240 }}>
        {data.length === 0 ? (
          <p className="text-xs text-ink-faint">
            This method reports no iteration history for mode {mode + 1}.
          </p>
        ) : (
          <ResponsiveContainer width="100%" height="100%">
            <LineChart data={data} margin={{ top: 4, right: 12, bottom: 14, left: 8 }}>
              <CartesianGrid stroke="#d6cfbf" strokeDasharray="2 3" />
              <XAxis
                dataKey="iteration"
                type="number"
                allowDecimals={false}
                domain={[1, Math.max(1, data.length)]}
                tick={{ fontSize: 11 }}
                label={{ value: 'iteration', position: 'insideBottom', offset: -8, fontSize: 11 }}
              />
              <YAxis
                type="number"
                domain={['auto', 'auto']}
                tick={{ fontSize: 11 }}
                width={56}
                tickFormatter={(v: number) => sig(v, 4)}
              />
              <Tooltip
                formatter={(v) => sig(Number(v), 8)}
                labelFormatter={(l) => `iteration ${String(l)}`}
              />
              <Line
                dataKey="rho"
                name="ρ (1/s²)"
                stroke={SERIES_COLOURS[0]}
                dot={data.length <= 40}
                isAnimationActive={false}
                strokeWidth={1.5}
              />
            </LineChart>
          </ResponsiveContainer>
        )}
      </div>
    </figure>
  );
}
