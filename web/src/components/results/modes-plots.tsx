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
import { sig } from '../../lib/format';
import { rhoAxis } from './rho-axis';
import { decimate } from './shape-rows';

export const SERIES_COLOURS = ['#1f6b5c', '#8a4b12', '#5b3f8c', '#a3261b', '#4a4f57', '#2d6a2f'];
const MAX_SHAPES = 6;
/** Above this many points along the model, each mode gets its own chart. */
const MANY_POINTS = 40;
/** Points drawn per shape at most: a model-scale shape is drawn through evenly spaced nodes. */
export const MAX_SHAPE_POINTS = 800;

/** One DOF label read as node and component: "w3" → (3, w), "N2 ux" → (2, ux), "u4" → (4, u). */
function parseDof(label: string): { node: number; component: string } | null {
  const frame = /^N(\d+)\s+(\S+)$/.exec(label);
  if (frame) return { node: Number(frame[1]), component: frame[2]! };
  const plain = /^([^\d\s]+)(\d+)$/.exec(label);
  return plain ? { node: Number(plain[2]), component: plain[1]! } : null;
}

const ROTATIONS = new Set(['θ', 'rz', 'rx', 'ry']);

export interface ShapeLayout {
  /** The components a model has, translations first ("w", "θ"; "ux", "uy", "rz"; "u"). */
  components: string[];
  /** Every node of the model, ascending (restrained DOFs included, drawn at zero). */
  nodes: number[];
  /** Row of `shapes` for (component, node), absent where the DOF is restrained. */
  row: Map<string, number>;
}

/** The nodes and components behind a model's DOF labels; null when a label cannot be read. */
export function shapeLayout(labels: readonly string[] | null | undefined): ShapeLayout | null {
  if (!labels || labels.length === 0) return null;
  const row = new Map<string, number>();
  const nodes = new Set<number>();
  const components: string[] = [];
  for (const [i, label] of labels.entries()) {
    const dof = parseDof(label);
    if (!dof) return null;
    nodes.add(dof.node);
    if (!components.includes(dof.component)) components.push(dof.component);
    row.set(`${dof.component} ${dof.node}`, i);
  }
  components.sort((a, b) => Number(ROTATIONS.has(a)) - Number(ROTATIONS.has(b)));
  return { components, nodes: [...nodes].sort((a, b) => a - b), row };
}

/**
 * Mode shapes. A generated model (its DOF labels known) is drawn per node for one component at a
 * time — a beam's deflection w along the span, left to right, with its restrained ends at zero; a
 * storey chain or frame upwards from node 1 — and rotations are one choice away. Typed or
 * uploaded matrices are drawn against the DOF number, upwards. Only the first six modes are drawn,
 * each through at most MAX_SHAPE_POINTS evenly spaced nodes (or DOFs).
 */
export function ModeShapePlot({
  shapes,
  count,
  dofLabels,
  rowDofs,
}: {
  shapes: number[][];
  count: number;
  /** The model's DOF labels (from the engine), when K came from a generator. */
  dofLabels?: readonly string[] | null;
  /** The 1-based DOF of each row when the rows are a preview (default: row i is DOF i + 1). */
  rowDofs?: readonly number[] | null;
}) {
  const layout = shapeLayout(dofLabels);
  const [picked, setPicked] = useState<string | null>(null);
  const component = layout ? (picked ?? layout.components[0]!) : null;
  const modes = Math.min(count, MAX_SHAPES, shapes[0]?.length ?? 0);
  const rows: { at: number; row: number | null }[] = decimate(
    layout && component
      ? layout.nodes.map((node) => ({
          at: node,
          row: layout.row.get(`${component} ${node}`) ?? null,
        }))
      : shapes.map((_, i) => ({ at: rowDofs?.[i] ?? i + 1, row: i })),
    MAX_SHAPE_POINTS,
  );
  // A storey chain's floors are levels 1…n above a fixed base: draw the base at level 0.
  const storeys = component === 'u' && rows[0]?.at === 1;
  if (storeys) rows.unshift({ at: 0, row: null });
  // Each shape scaled to a largest component of 1 in what is drawn (the table keeps the
  // normalization asked for).
  const scale = Array.from({ length: modes }, (_, j) => {
    const max = Math.max(
      ...rows.map((r) => (r.row === null ? 0 : Math.abs(shapes[r.row]?.[j] ?? 0))),
    );
    return max > 0 ? 1 / max : 1;
  });
  const data = rows.map((r) => {
    const point: Record<string, number> = { at: r.at };
    for (let j = 0; j < modes; j++) {
      point[`m${j + 1}`] = r.row === null ? 0 : (shapes[r.row]?.[j] ?? 0) * (scale[j] ?? 1);
    }
    return point;
  });
  // A beam's deflection reads along the span; chains and frames read like the building.
  const alongSpan = component === 'w';
  const axisName = storeys ? 'Level' : layout ? 'Node' : 'DOF';
  const lo = data[0]?.at ?? 1;
  const hi = Math.max(lo, data[data.length - 1]?.at ?? 1);
  const positionAxis = {
    type: 'number' as const,
    dataKey: 'at',
    domain: [lo, hi],
    allowDecimals: false,
    tick: { fontSize: 11 },
  };
  const valueAxis = {
    type: 'number' as const,
    domain: [-1, 1],
    ticks: [-1, -0.5, 0, 0.5, 1],
    tick: { fontSize: 11 },
    tickFormatter: (v: number) => sig(v, 2),
  };
  // Six overlaid shapes of a model with many DOFs are a tangle: draw each mode in its own small
  // chart instead (small multiples), which also prints.
  const separate = modes > 1 && rows.length > MANY_POINTS;
  const chart = (keys: number[], height: number, legend: boolean) => (
    <div style={{ height }}>
      <ResponsiveContainer width="100%" height="100%">
        <LineChart
          data={data}
          layout={alongSpan ? 'horizontal' : 'vertical'}
          margin={{ top: 4, right: 12, bottom: alongSpan ? 12 : 4, left: 0 }}
        >
          <CartesianGrid stroke="#d6cfbf" strokeDasharray="2 3" />
          {alongSpan ? (
            <>
              <XAxis
                {...positionAxis}
                label={{ value: axisName, position: 'insideBottom', offset: -8, fontSize: 11 }}
              />
              <YAxis {...valueAxis} width={36} />
            </>
          ) : (
            <>
              <XAxis {...valueAxis} />
              <YAxis
                {...positionAxis}
                reversed
                width={32}
                label={{ value: axisName, angle: -90, position: 'insideLeft', fontSize: 11 }}
              />
            </>
          )}
          <Tooltip
            formatter={(v) => sig(Number(v), 4)}
            labelFormatter={(l) => `${axisName} ${String(l)}`}
          />
          {legend ? (
            <Legend wrapperStyle={{ fontSize: 11, paddingTop: alongSpan ? 14 : 0 }} />
          ) : null}
          {keys.map((j) => (
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
  );
  const all = Array.from({ length: modes }, (_, j) => j);
  return (
    <figure className="min-w-0 flex-1" aria-label="Mode shapes">
      <figcaption className="mb-1 flex items-center justify-between gap-2 text-xs font-semibold tracking-wide text-ink-soft uppercase">
        <span>
          Mode shapes{' '}
          <span className="font-normal normal-case">
            ({layout && component ? `${component} at each node, ` : ''}each scaled to a largest
            value of 1{separate ? `; ${rows.length} points, one chart per mode` : ''})
          </span>
        </span>
        {layout && layout.components.length > 1 ? (
          // on paper the caption names the component shown; the control is for the screen
          <label className="flex items-center gap-1 font-normal normal-case print:hidden">
            Component
            <select
              className="rounded-sm border border-rule-strong bg-paper-sheet px-1 py-0.5 text-xs"
              value={component ?? ''}
              onChange={(e) => setPicked(e.target.value)}
            >
              {layout.components.map((c) => (
                <option key={c} value={c}>
                  {c}
                  {ROTATIONS.has(c) ? ' (rotation)' : ''}
                </option>
              ))}
            </select>
          </label>
        ) : null}
      </figcaption>
      {separate ? (
        <ol className="grid grid-cols-1 gap-2 sm:grid-cols-2" aria-label="One chart per mode">
          {all.map((j) => (
            <li key={j} className="min-w-0 break-inside-avoid" aria-label={`Mode ${j + 1}`}>
              <p className="text-xs text-ink-soft">Mode {j + 1}</p>
              {chart([j], 150, false)}
            </li>
          ))}
        </ol>
      ) : (
        chart(all, 240, true)
      )}
    </figure>
  );
}

/** The Rayleigh quotient ρ against the iteration, for one mode at a time. */
export function ConvergencePlot({ histories }: { histories: number[][] }) {
  const [mode, setMode] = useState(0);
  const history = histories[mode] ?? [];
  const data = history.map((rho, i) => ({ iteration: i + 1, rho }));
  const { domain, digits } = rhoAxis(history);
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
        ) : data.length === 1 ? (
          // one point is not a curve: say what it means instead of drawing a lone dot
          <p className="text-xs text-ink-soft">
            Mode {mode + 1} converged in one step: ρ = {sig(data[0]!.rho, 8)} (1/s²).
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
                domain={domain}
                tick={{ fontSize: 11 }}
                width={digits > 4 ? 72 : 56}
                tickFormatter={(v: number) => sig(v, digits)}
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
