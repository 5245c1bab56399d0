import { describe, expect, it } from 'vitest';
import { evaluateSheet, FORBIDDEN_FUNCTIONS, type CalcBlockResult } from '../../../core/index';

// mathjs docs/expressions/security.md lists the functions to disable in an untrusted expression
// parser: import, createUnit, evaluate, parse, simplify, derivative, resolve, reviver (and the
// ones that reach the parser: compile, chain, parser, …). random* are disabled for determinism.
function errorsOf(source: string) {
  return evaluateSheet({ blocks: [{ id: 'c', kind: 'calc', source }] }).errors;
}

describe('sheet security', () => {
  it.each([...FORBIDDEN_FUNCTIONS])('refuses %s', (name) => {
    const errors = errorsOf(`x = ${name}("1 + 1")`);
    expect(errors).toHaveLength(1);
    expect(errors[0]!.message).toBe(`${name} is not available in a sheet.`);
    expect(errors[0]!.line).toBe(1);
  });

  it('refuses a forbidden function passed around by name', () => {
    const errors = errorsOf('f = evaluate\ny = f("2")');
    expect(errors[0]!.message).toBe('evaluate is not available in a sheet.');
  });

  it.each(['config({number: "BigNumber"})', 'typed("x", {})', 'Parser()', 'Unit(1, "m")'])(
    'refuses %s, which changes the instance or builds parsers',
    (expr) => {
      const errors = errorsOf(`x = ${expr}`);
      expect(errors).toHaveLength(1);
      expect(errors[0]!.message).toMatch(/not available in a sheet/);
    },
  );

  it('refuses access to constructors and prototypes', () => {
    const errors = errorsOf('x = cos.constructor("return 1")');
    expect(errors).toHaveLength(1);
    expect(errors[0]!.message).toMatch(/constructor/);
  });

  it('stops a matrix larger than the limit before allocating it', () => {
    const r = evaluateSheet({
      blocks: [{ id: 'c', kind: 'calc', source: 'n = 3000\nA = zeros(n, n)\nB = ones(10, 10)' }],
    });
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ line: 2, code: 'SHEET_LIMIT' });
    // The next line still evaluates.
    expect((r.blocks[0] as CalcBlockResult).lines.map((l) => l.name)).toEqual(['n', 'B']);
  });

  it('applies a smaller limit when asked', () => {
    const r = evaluateSheet(
      { blocks: [{ id: 'c', kind: 'calc', source: 'A = identity(20)' }] },
      { maxMatrixEntries: 100 },
    );
    expect(r.errors[0]).toMatchObject({ line: 1, code: 'SHEET_LIMIT' });
  });

  it('keeps the shared instance unchanged after a refused call', () => {
    errorsOf('x = config({number: "BigNumber"})');
    const r = evaluateSheet({ blocks: [{ id: 'c', kind: 'calc', source: 'x = 0.1 + 0.2' }] });
    // IEEE double arithmetic: 0.1 + 0.2 = 0.30000000000000004 (a BigNumber instance would give 0.3).
    const v = (r.blocks[0] as CalcBlockResult).lines[0]!.value;
    expect(v).toEqual({ type: 'number', value: 0.1 + 0.2 });
  });
});
