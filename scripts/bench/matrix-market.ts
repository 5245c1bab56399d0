import { createWriteStream } from 'node:fs';
import type { SparseSymmetricMatrix } from '../../core/index';

/**
 * Writes the lower triangle as a Matrix Market `coordinate real symmetric` file (1-based indices,
 * 17 significant digits so the file reads back bit for bit).
 */
export async function writeMatrixMarket(
  path: string,
  A: SparseSymmetricMatrix,
  comment: string,
): Promise<void> {
  const out = createWriteStream(path);
  const write = (s: string): Promise<void> =>
    new Promise((resolve, reject) => {
      if (out.write(s)) resolve();
      else out.once('drain', resolve).once('error', reject);
    });
  const nnz = A.colPtr[A.n]!;
  await write(
    `%%MatrixMarket matrix coordinate real symmetric\n% ${comment}\n${A.n} ${A.n} ${nnz}\n`,
  );
  let chunk: string[] = [];
  for (let j = 0; j < A.n; j++) {
    for (let p = A.colPtr[j]!; p < A.colPtr[j + 1]!; p++) {
      chunk.push(`${A.rowIdx[p]! + 1} ${j + 1} ${A.values[p]!.toPrecision(17)}\n`);
    }
    if (chunk.length > 50_000) {
      await write(chunk.join(''));
      chunk = [];
    }
  }
  await write(chunk.join(''));
  await new Promise<void>((resolve, reject) =>
    out.end((err?: Error | null) => (err ? reject(err) : resolve())),
  );
}
