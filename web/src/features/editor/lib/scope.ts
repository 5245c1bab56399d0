// Names in scope for completion: scope flows top to bottom (DESIGN.md §4), so a block sees the
// names defined above it and on its own earlier lines. Read from the sources (so completion works
// before the first evaluation) and from the last results (which know the fields of objects).
import type { BlockResult, SheetValue } from '../api/results';
import type { Block } from '../api/types';

export type ScopeName = { label: string; detail: string };

/** Fields a `modes` block binds under its name (core/sheet README). */
export const MODES_FIELDS: readonly [string, string][] = [
  ['f', 'frequencies, Hz'],
  ['T', 'periods, s'],
  ['omega', 'circular frequencies, rad/s'],
  ['lambda', 'eigenvalues, 1/s²'],
  ['phi', 'mode shapes, columns = modes'],
  ['gamma', 'participation factors'],
  ['meff', 'effective masses'],
  ['ratio', 'effective mass ratios 0–1'],
  ['cumulative', 'cumulative mass ratios 0–1'],
  ['sturm', 'Sturm sequence result'],
  ['dt_cr', 'critical time step (forward)'],
];

/** What a response block binds, per analysis (core/sheet/README.md). */
const RESPONSE_FIELDS: Record<string, readonly [string, string][]> = {
  spectrum: [
    ['V', 'base shear (scaled)'],
    ['V_modal', 'base shear before scaling'],
    ['u', 'peak displacements'],
    ['drift', 'storey drifts'],
    ['drift_ratio', 'drift / storey height'],
    ['storey_shear', 'storey shears'],
    ['overturning', 'overturning moments'],
    ['V_elf', 'ELF base shear'],
    ['scale', 'ELF scale factor'],
    ['mass_ratio', 'share of the mass in the modes'],
  ],
  harmonic: [
    ['u_run', 'amplitudes at the running speed'],
    ['v_run', 'velocities at the running speed'],
    ['u_max', 'largest amplitudes'],
    ['separation', 'nearest mode from the running speed, 0–1'],
  ],
  history: [
    ['peak', 'peak displacements'],
    ['t_peak', 'times of the peaks'],
    ['V_peak', 'peak base shear'],
    ['dt_cr', 'central-difference stable step'],
  ],
  walking: [
    ['a', 'peak walking acceleration'],
    ['a_g', 'a / g'],
    ['limit', 'acceleration limit'],
  ],
};

const GENERATOR_FIELDS: readonly [string, string][] = [
  ['K', 'stiffness matrix'],
  ['M', 'mass matrix'],
  ['r', 'influence vector'],
];

function header(source: string, key: string): string | null {
  const match = new RegExp(`^\\s*${key}\\s*:\\s*([^#\\n]+)`, 'mi').exec(source);
  return match?.[1]?.trim() ?? null;
}

function fieldsOf(value: SheetValue | undefined, prefix: string, out: ScopeName[]): void {
  if (!value || value.type !== 'object') return;
  for (const [field, inner] of Object.entries(value.fields)) {
    out.push({ label: `${prefix}.${field}`, detail: inner.type });
    fieldsOf(inner, `${prefix}.${field}`, out);
  }
}

/**
 * The names visible at `line` (1-based) of block `blockIndex`: everything defined in the blocks
 * above and on the lines above in this block.
 */
export function namesInScope(
  blocks: readonly Block[],
  blockIndex: number,
  line: number,
  results: readonly BlockResult[] | undefined,
): ScopeName[] {
  const out: ScopeName[] = [];
  const seen = new Set<string>();
  const add = (label: string, detail: string) => {
    if (seen.has(label)) return;
    seen.add(label);
    out.push({ label, detail });
  };
  blocks.forEach((block, index) => {
    if (index > blockIndex) return;
    const lines = block.source.split('\n');
    const visible = index === blockIndex ? lines.slice(0, Math.max(0, line - 1)) : lines;
    if (block.kind === 'calc') {
      const result = results?.find((r) => r.blockId === block.id);
      visible.forEach((text, i) => {
        const match = /^\s*([A-Za-z_]\w*)\s*=(?!=)/.exec(text);
        const name = match?.[1];
        if (!name) return;
        const generated = /=\s*(storey_chain|beam|plane_frame)\s*\(/.exec(text)?.[1];
        add(name, generated ? `${generated} model` : 'calc');
        const lineResult =
          result?.kind === 'calc' ? result.lines.find((l) => l.line === i + 1) : undefined;
        if (lineResult?.value.type === 'object') {
          const fields: ScopeName[] = [];
          fieldsOf(lineResult.value, name, fields);
          fields.forEach((f) => add(f.label, f.detail));
        } else if (generated) {
          GENERATOR_FIELDS.forEach(([field, detail]) => add(`${name}.${field}`, detail));
        }
      });
    } else if (block.kind === 'matrix' && index < blockIndex) {
      const name = header(block.source, 'name');
      if (name)
        add(
          name,
          `matrix${header(block.source, 'unit') ? `, ${header(block.source, 'unit')}` : ''}`,
        );
    } else if (block.kind === 'modes' && index < blockIndex) {
      const name = header(block.source, 'name');
      if (name) {
        add(name, 'modes');
        MODES_FIELDS.forEach(([field, detail]) => add(`${name}.${field}`, detail));
      }
    } else if (block.kind === 'response' && index < blockIndex) {
      const name = header(block.source, 'name') ?? 'response';
      const analysis = header(block.source, 'analysis')?.toLowerCase() ?? '';
      add(name, `response (${analysis || 'analysis'})`);
      (RESPONSE_FIELDS[analysis] ?? []).forEach(([field, detail]) =>
        add(`${name}.${field}`, detail),
      );
    }
  });
  return out;
}
