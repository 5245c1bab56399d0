// The in-app reference (web/src/config/sheet-reference.ts) against the sheet engine: every example
// and every new block's starting text evaluates through core without an error, and the keys and
// functions listed are the ones the editor and the engine know.
import { describe, expect, it } from 'vitest';
import { evaluateSheet, type Sheet } from '../../core/index';
import {
  BLOCK_REFERENCE,
  FUNCTION_REFERENCE,
  MATRIX_KEY_REFERENCE,
  MODES_KEY_REFERENCE,
  RESPONSE_KEY_REFERENCE,
  TOPIC_REFERENCE,
  type ExampleBlock,
} from '../../web/src/config/sheet-reference';
import { BLOCK_KINDS } from '../../web/src/features/editor/api/types';
import { referenceAt } from '../../web/src/features/editor/lib/completion';
import {
  MATRIX_KEYS,
  MODES_KEYS,
  RESPONSE_KEYS,
  SHEET_FUNCTIONS,
} from '../../web/src/features/editor/lib/sheet-language';

function evaluate(blocks: readonly ExampleBlock[]) {
  const sheet: Sheet = { blocks: blocks.map((b, i) => ({ id: `ex${i}`, ...b })) };
  return evaluateSheet(sheet);
}

describe('the sheet reference', () => {
  it.each(FUNCTION_REFERENCE.map((f) => [f.name, f] as const))(
    'evaluates the example of %s without an error',
    (name, entry) => {
      const results = evaluate(entry.example);
      expect(results.errors).toEqual([]);
      const last = results.blocks.at(-1);
      expect(last?.kind).toBe('calc');
      // the example uses what it documents (a conversion is written between its operands)
      expect(entry.example.map((b) => b.source).join('\n')).toMatch(new RegExp(`\\b${name}\\b`));
    },
  );

  it.each(BLOCK_REFERENCE.map((b) => [b.kind, b] as const))(
    'evaluates the example and the starting text of a %s block',
    (kind, entry) => {
      expect(evaluate(entry.example).errors).toEqual([]);
      const above = entry.starterAbove ?? [];
      const started = evaluate([
        ...above,
        { kind: entry.kind as ExampleBlock['kind'], source: entry.starter },
      ]);
      expect(started.errors).toEqual([]);
      if (entry.starter !== '') expect(started.blocks.at(-1)?.ok).toBe(true);
      expect(entry.example.at(-1)?.kind).toBe(kind);
    },
  );

  it.each(TOPIC_REFERENCE.map((t) => [t.title, t] as const))(
    'evaluates the example of “%s” with its uploads',
    (_title, topic) => {
      const sheet: Sheet = { blocks: topic.example.map((b, i) => ({ id: `ex${i}`, ...b })) };
      const results = evaluateSheet(sheet, { uploads: topic.uploads });
      expect(results.errors).toEqual([]);
      expect(results.summary.failed).toBe(0);
    },
  );

  it('gives the labelled example the two-storey frame’s effective masses, 8/9 and 1/9', () => {
    const topic = TOPIC_REFERENCE.find((t) => t.id === 'dof-labels')!;
    const sheet: Sheet = { blocks: topic.example.map((b, i) => ({ id: `ex${i}`, ...b })) };
    const modes = evaluateSheet(sheet, { uploads: topic.uploads }).blocks[2];
    if (modes?.kind !== 'modes') throw new Error('no modes result');
    // REFERENCES.md item 3 (Chopra, chapter 10, from memory): 8/9 and 1/9 of the x mass; the y
    // and twist modes (2, 3, 5, 6) have none along x. Absolute 1e-10 on a dense 6 × 6 solve.
    const expected = [8 / 9, 0, 0, 1 / 9, 0, 0];
    modes.modes.forEach((m, i) => expect(Math.abs(m.ratio! - expected[i]!)).toBeLessThan(1e-10));
  });

  it('solves the new modes block’s starting point: two modes with participation', () => {
    const starter = BLOCK_REFERENCE.find((b) => b.kind === 'modes')!.starter;
    const results = evaluate([{ kind: 'modes', source: starter }]);
    const modes = results.blocks[0];
    if (modes?.kind !== 'modes') throw new Error('no modes result');
    // K = 1e6 [2 −1; −1 1] N/m, M = 1000 I kg: λ = 1000 (3 ∓ √5)/2 (closed form of the 2 × 2
    // pencil, det(K − λM) = 0).
    const lambdas = [(1000 * (3 - Math.sqrt(5))) / 2, (1000 * (3 + Math.sqrt(5))) / 2];
    modes.modes.forEach((m, i) => {
      expect(Math.abs(m.omega ** 2 - lambdas[i]!) / lambdas[i]!).toBeLessThan(1e-10);
    });
    expect(modes.participation).not.toBeNull();
  });

  it('documents every block kind, every key and every function the editor offers', () => {
    expect(BLOCK_REFERENCE.map((b) => b.kind).sort()).toEqual([...BLOCK_KINDS].sort());
    expect(MODES_KEY_REFERENCE.map((k) => k.key)).toEqual([...MODES_KEYS]);
    expect(MATRIX_KEY_REFERENCE.map((k) => k.key)).toEqual([...MATRIX_KEYS]);
    expect(RESPONSE_KEY_REFERENCE.map((k) => k.key)).toEqual([...RESPONSE_KEYS]);
    const documented = new Set(FUNCTION_REFERENCE.map((f) => f.name));
    expect(SHEET_FUNCTIONS.filter((f) => !documented.has(f))).toEqual([]);
  });
});

describe('referenceAt (hover in the editor)', () => {
  it('gives a generator’s signature under the pointer in a calc line, not in its comment', () => {
    const line = 'frame = storey_chain([20 t], [30 kN/mm])  # beam';
    expect(referenceAt('calc', line, line.indexOf('storey') + 3)).toMatch(
      /^storey_chain\(masses, stiffnesses\)\n/,
    );
    expect(referenceAt('calc', line, line.indexOf('beam') + 1)).toBeNull();
    expect(referenceAt('calc', line, 1)).toBeNull();
  });

  it('gives a modes key’s values and default, and says when a key is required', () => {
    expect(referenceAt('modes', 'count: 3', 2)).toContain('Default: 3.');
    expect(referenceAt('modes', 'stiffness: frame.K', 3)).toContain('Required.');
    expect(referenceAt('modes', 'stiffness: frame.K', 14)).toBeNull();
  });

  it('gives a response key’s values and default, whatever its case', () => {
    expect(referenceAt('response', 'SDS: 1.0', 1)).toMatch(/^sds: a number in g/);
    expect(referenceAt('response', 'combine: srss', 2)).toContain('Default: cqc.');
    expect(referenceAt('response', 'modes: frame', 2)).toContain('Required.');
  });

  it('runs the response starter on the modes starter: a spectrum analysis with a base shear', () => {
    const entry = BLOCK_REFERENCE.find((b) => b.kind === 'response')!;
    const results = evaluate([...entry.starterAbove!, { kind: 'response', source: entry.starter }]);
    const rsa = results.blocks.at(-1);
    if (rsa?.kind !== 'response') throw new Error('no response result');
    expect(rsa.ok).toBe(true);
    expect(rsa.analysis).toBe('spectrum');
  });
});
