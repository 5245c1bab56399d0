import { describe, expect, it } from 'vitest';
import { digestSheet, evaluateSheet, type Sheet } from '../../../core/index';

// Results that are not finite numbers, in an engineer's words, each naming block and line.
// IEEE 754 binary64 (IEEE Std 754-2019): the largest finite double is (2 − 2^−52)·2^1023
// ≈ 1.7977e308, so 2^1024 and anything larger overflow to Infinity; 0/0 and ∞ − ∞ give NaN.
// 170! ≈ 7.257e306 is finite and 171! ≈ 1.241e309 is not (from memory of the factorial table;
// the bound itself is the closed form above).

function errorsOf(source: string) {
  const r = evaluateSheet({ blocks: [{ id: 'loads', kind: 'calc', source }] });
  return r.errors;
}

describe('calc lines whose value is not finite', () => {
  const overflow: [string, string][] = [
    ['x = 1e308^1e308', '1e+308 ^ 1e+308'],
    ['x = 2^1e6', '2 ^ 1e+6'],
    ['x = factorial(171)', 'factorial(171)'],
    ['F = 1e200 kN * 1e200 m', '1e+200 kN * 1e+200 m'],
  ];
  it.each(overflow)('calls %s an overflow past about 1.8e308, naming the operation', (src, op) => {
    const errors = errorsOf(`a = 1\n${src}`);
    expect(errors).toHaveLength(1);
    expect(errors[0]).toMatchObject({ blockId: 'loads', line: 2, code: 'SHEET_EVAL' });
    expect(errors[0]!.message).toBe(
      `Overflow: ${op} is larger than about 1.8e308, past the largest number a calculation can hold. Check the exponent and the units.`,
    );
    expect(errors[0]!.message).not.toMatch(/Division/);
  });

  it('keeps 2^1023 and factorial(170), which are finite', () => {
    expect(errorsOf('x = 2^1023\ny = factorial(170)')).toEqual([]);
  });

  it('says an overflow below about −1.8e308 for a large negative result', () => {
    expect(errorsOf('x = -1e308 * 10')[0]!.message).toMatch(/^Overflow: .* below about −1\.8e308/);
  });

  it('names NaN typed in as a value a sheet cannot use, not as 0/0', () => {
    const [e] = errorsOf('x = NaN');
    expect(e).toMatchObject({ blockId: 'loads', line: 1 });
    expect(e!.message).toBe('NaN is not a value a sheet can calculate with; give a number.');
  });

  it('names a division by zero and the division, with units', () => {
    const [e] = errorsOf('k = 1 kN/m\nx = k / (0 kN/m)');
    expect(e).toMatchObject({ line: 2 });
    expect(e!.message).toBe('Division by zero: the divisor in k / (0 kN / m) is zero.');
    expect(errorsOf('x = 0/0')[0]!.message).toBe(
      'Division of zero by zero: 0 / 0 is undefined (0/0).',
    );
  });

  it('names the logarithm of zero', () => {
    expect(errorsOf('x = log(0)')[0]!.message).toBe(
      'The logarithm of zero is minus infinity: log(0).',
    );
  });
});

describe('modes blocks whose solution is not finite', () => {
  function modes(k: string, m: string): Sheet {
    return {
      blocks: [
        { id: 'k', kind: 'matrix', source: `name: K\nunit: kN/m\n\n${k}` },
        { id: 'm', kind: 'matrix', source: `name: M\nunit: t\n\n${m}` },
        { id: 'deck', kind: 'modes', source: 'stiffness: K\nmass: M\ncount: 2\nname: s' },
      ],
    };
  }

  it('names M and its zero diagonal entry on the mass line, and leaves results that can be stored', () => {
    const sheet = modes('2000, -1000\n-1000, 1000', '0, 0\n0, 0');
    const r = evaluateSheet(sheet);
    const e = r.errors.find((x) => x.blockId === 'deck');
    expect(e).toMatchObject({ line: 2, code: 'SHEET_EVAL' });
    expect(e!.message).toMatch(
      /^The modes cannot be stored: .* is (not a number \(NaN\)|infinite)\./,
    );
    expect(e!.message).toMatch(/M is zero on its diagonal at entry \(1, 1\)/);
    // Nothing non-finite is left in the results: they digest (canonical JSON refuses NaN).
    expect(() => digestSheet(sheet, r)).not.toThrow();
  });

  it('names K and its zero diagonal entry on the stiffness line', () => {
    const sheet = modes('0, 0\n0, 0', '10, 0\n0, 10');
    const r = evaluateSheet(sheet);
    const e = r.errors.find((x) => x.blockId === 'deck');
    expect(e).toMatchObject({ line: 1 });
    expect(e!.message).toMatch(/K is zero on its diagonal at entry \(1, 1\)/);
    expect(() => digestSheet(sheet, r)).not.toThrow();
  });
});
