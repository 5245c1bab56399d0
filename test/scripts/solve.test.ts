import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
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

  it('reads a large mass file in a thread of its own: a 400 000-DOF chain to its closed form, and an error on the last line of a 6 MB file named as if read in line', () => {
    // M's file is over THREAD_READ_BYTES (4 MB), so the command parses it beside K
    const N = 400000;
    const [k, m] = chainFiles(N);
    expect(statSync(m).size).toBeGreaterThan(4 * 1024 * 1024);
    const r = run(['--stiffness', k, '--mass', m, '--count', '3', '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.n).toBe(N);
    // λ_max / λ₁ ≈ 4 / 1.5e-11 here: the lowest modes keep about five digits (8e-7 measured;
    // the engine warns ILL_CONDITIONED), which is all this check of the reading asks
    out.modes.forEach((mode: { lambda: number }, i: number) => {
      expect(Math.abs(mode.lambda / exact(N, i + 1) - 1)).toBeLessThan(1e-5);
    });
    expect(out.warnings.map((w: { code: string }) => w.code)).toContain('ILL_CONDITIONED');
    // the same file with its last entry's row out of range: the thread's reader error, in its words
    const text = readFileSync(m, 'utf8').trimEnd().split('\n');
    const lastLine = text.length;
    text[lastLine - 1] = `${N + 1} ${N} 1`;
    const bad = join(dir, 'M-bad-last.mtx');
    writeFileSync(bad, `${text.join('\n')}\n`);
    const e = run(['--stiffness', k, '--mass', bad, '--count', '3']);
    expect(e.status).toBe(1);
    expect(e.stderr).toMatch(
      new RegExp(
        `MATRIX_FILE_INVALID: M-bad-last.mtx, line ${lastLine}: row index ${N + 1} is out of range`,
      ),
    );
    // and a mass file that is not there is a command-line error (exit 2), as without the thread
    const gone = run(['--stiffness', k, '--mass', join(dir, 'nowhere.mtx')]);
    expect(gone.status).toBe(2);
    expect(gone.stderr).toMatch(/cannot read the mass file/);
  });

  it('solves every mode of a 300-DOF fixed–free chain with --method dense on two threads, each within 1e-11 of the closed form, orthogonality checked over all of them', () => {
    const N = 300;
    const [k, m] = chainFiles(N);
    const r = run(['--stiffness', k, '--mass', m, '--method', 'dense', '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.method).toBe('dense');
    expect(out.modes).toHaveLength(N);
    // one thread per core up to the dense method's two parts (the CI machine has two cores)
    expect(out.threads).toBe(Math.min(2, availableParallelism()));
    for (const j of [1, 2, 150, 299, 300]) {
      expect(Math.abs(out.modes[j - 1].lambda / exact(N, j) - 1)).toBeLessThan(1e-11);
    }
    // 300 modes: the triangle of ΦᵀMΦ in parts (BLOCKED_GRAM_MODES, SPLIT_MIN)
    expect(out.orthogonality).toBeGreaterThan(0);
    expect(out.orthogonality).toBeLessThan(1e-12);
  });

  it('adds a response-spectrum analysis: two-storey frame 2m, m / 2k, k with a flat spectrum gives modal base shears 8/9 and 1/9 of 3m·Sa (Chopra, chapter 10 example, from memory; relative 1e-10)', () => {
    const m = 1.0e5;
    const k = 4.0e7;
    const { K, M } = storeyChain({ masses: [2 * m, m], stiffnesses: [2 * k, k] });
    const kf = join(dir, 'K2s.mtx');
    const mf = join(dir, 'M2s.mtx');
    writeFileSync(kf, writeMatrixMarket(K));
    writeFileSync(mf, writeMatrixMarket(M));
    const sf = join(dir, 'S.csv');
    writeFileSync(sf, 'period_s,Sa_m_s2\n0,3\n10,3\n');
    const r = run([
      '--stiffness',
      kf,
      '--mass',
      mf,
      '--spectrum',
      sf,
      '--damping',
      '0.05',
      '--combine',
      'srss',
      '--json',
    ]);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout).response;
    expect(out.combination).toBe('srss');
    expect(out.damping).toBe(0.05);
    expect(out.modes).toHaveLength(2);
    const [m1, m2] = out.modes;
    for (const key of ['mode', 'period', 'Sa', 'gamma', 'effectiveMass', 'baseShear'])
      expect(typeof m1[key]).toBe('number');
    const rel = (a: number, b: number) => Math.abs(a / b - 1);
    expect(rel(m1.baseShear, (8 / 9) * 3 * m * 3)).toBeLessThan(1e-10);
    expect(rel(m2.baseShear, (1 / 9) * 3 * m * 3)).toBeLessThan(1e-10);
    // Γ_n² S_a for mass-normalized shapes, and peak displacement Γ_n φ_n S_a/ω_n² at the roof
    expect(rel(m1.gamma ** 2 * m1.Sa, m1.baseShear)).toBeLessThan(1e-12);
    expect(rel(out.baseShear, Math.hypot(m1.baseShear, m2.baseShear))).toBeLessThan(1e-12);
    // roof: mode 1 shape [½, 1] with Γ₁φ_roof = 4/3, mode 2 [−1, 1] with Γ₂φ_roof = −1/3
    const w1 = Math.sqrt(k / (2 * m));
    const w2 = Math.sqrt((2 * k) / m);
    expect(
      rel(out.displacement[1], Math.hypot(((4 / 3) * 3) / w1 ** 2, ((1 / 3) * 3) / w2 ** 2)),
    ).toBeLessThan(1e-10);
  });

  it('refuses a spectrum table that does not reach a mode, naming the mode and its period', () => {
    const { K, M } = storeyChain({ masses: [1e5], stiffnesses: [4e6] }); // T = 2π√(m/k) ≈ 0.993 s
    const kf = join(dir, 'K1s.mtx');
    const mf = join(dir, 'M1s.mtx');
    writeFileSync(kf, writeMatrixMarket(K));
    writeFileSync(mf, writeMatrixMarket(M));
    const sf = join(dir, 'short.csv');
    writeFileSync(sf, '0,3\n0.5,3\n');
    const r = run(['--stiffness', kf, '--mass', mf, '--spectrum', sf, '--combine', 'cqc']);
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(
      /INVALID_OPTION: Mode 1 \(T = 0\.9935 s\): The period 0\.9935 s is outside the spectrum table \(0 s to 0\.5 s\)/,
    );
    const bad = run(['--stiffness', kf, '--mass', mf, '--spectrum', sf, '--combine', 'abs']);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/--combine is srss or cqc/);
  });

  it('takes the influence vector from --influence: the effective masses of all modes add up to rᵀMr (REFERENCES.md, "Properties"; relative 1e-10)', () => {
    const m = 1.0e5;
    const { K, M } = storeyChain({ masses: [2 * m, m], stiffnesses: [8e7, 4e7] });
    const kf = join(dir, 'K2i.mtx');
    const mf = join(dir, 'M2i.mtx');
    const rf = join(dir, 'r.mtx');
    writeFileSync(kf, writeMatrixMarket(K));
    writeFileSync(mf, writeMatrixMarket(M));
    writeFileSync(rf, '%%MatrixMarket matrix array real general\n2 1\n1\n0\n');
    const sf = join(dir, 'S2.csv');
    writeFileSync(sf, '0,3\n10,3\n');
    const r = run(['--stiffness', kf, '--mass', mf, '--spectrum', sf, '--influence', rf, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout).response;
    expect(out.combination).toBe('cqc');
    const total = out.modes.reduce(
      (a: number, x: { effectiveMass: number }) => a + x.effectiveMass,
      0,
    );
    expect(Math.abs(total / (2 * m) - 1)).toBeLessThan(1e-10);
  });
});
