import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { storeyChain, writeMatrixMarket } from '../../core/index';

const dir = mkdtempSync(join(tmpdir(), 'solve-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(args: string[]) {
  const r = spawnSync('npx', ['tsx', 'scripts/solve.ts', ...args], {
    encoding: 'utf8',
    timeout: 90_000,
  });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

function chainFiles(N: number): [string, string] {
  const { K, M } = storeyChain({ masses: new Array(N).fill(1), stiffnesses: new Array(N).fill(1) });
  const k = join(dir, `K${N}.mtx`);
  const m = join(dir, `M${N}.mtx`);
  writeFileSync(k, writeMatrixMarket(K));
  writeFileSync(m, writeMatrixMarket(M));
  return [k, m];
}

// fixed–free chain closed form (REFERENCES.md item 2)
const exact = (N: number, n: number) =>
  4 * Math.sin(((2 * n - 1) * Math.PI) / (2 * (2 * N + 1))) ** 2;

describe('scripts/solve.ts', () => {
  it('prints a readable table for a small Matrix Market pair', () => {
    const [k, m] = chainFiles(6);
    const r = run(['--stiffness', k, '--mass', m, '--count', '3']);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/6 DOFs, method dense/);
    expect(r.stdout).toMatch(/mode\s+λ \(rad²\/s²\)\s+ω \(rad\/s\)\s+f \(Hz\)\s+T \(s\)/);
    const firstRow = r.stdout.split('\n').find((l) => /^\s+1\s/.test(l)) as string;
    expect(Number(firstRow.trim().split(/\s+/)[1])).toBeCloseTo(exact(6, 1), 9);
    expect(r.stdout).toMatch(/Sturm check .* consistent/);
  });

  it('reports errors on stderr with a non-zero exit', () => {
    const bad = join(dir, 'bad.mtx');
    writeFileSync(bad, '%%MatrixMarket matrix coordinate real symmetric\n2 2 2\n1 1 1\n3 1 1\n');
    const [, m] = chainFiles(2);
    const r = run(['--stiffness', bad, '--mass', m]);
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/MATRIX_FILE_INVALID: bad.mtx, line 4: row index 3 is out of range/);
    expect(r.stdout).toBe('');
  });

  it('prints JSON with the documented fields; 20 000-DOF fixed–free chain lowest 10 within 1e-9 of the closed form (issue "done when")', () => {
    const N = 20000;
    const [k, m] = chainFiles(N);
    const r = run(['--stiffness', k, '--mass', m, '--count', '10', '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.n).toBe(N);
    expect(out.method).toBe('lanczos');
    expect(out.modes).toHaveLength(10);
    out.modes.forEach((mode: Record<string, number>, i: number) => {
      for (const key of ['lambda', 'omega', 'frequencyHz', 'periodS', 'residual', 'iterations'])
        expect(typeof mode[key]).toBe('number');
      expect(Math.abs((mode.lambda as number) / exact(N, i + 1) - 1)).toBeLessThan(1e-9);
    });
    expect(out.orthogonality).toBeLessThan(1e-12);
    expect(out.warnings.map((w: { code: string }) => w.code)).toContain('ILL_CONDITIONED');
    expect(typeof out.seconds).toBe('number');
  });
});
