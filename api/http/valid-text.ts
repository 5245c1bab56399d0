import type { RequestHandler } from 'express';
import { AppError } from './errors';

/** A UTF-16 surrogate code unit that is not half of a pair: text that UTF-8 cannot hold. */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

interface Found {
  path: (string | number)[];
  text: string;
  index: number;
}

function findLoneSurrogate(value: unknown, path: (string | number)[], depth: number): Found | null {
  if (typeof value === 'string') {
    const m = LONE_SURROGATE.exec(value);
    return m ? { path, text: value, index: m.index } : null;
  }
  // express.json has already bounded the body's size; the depth bound keeps the walk off the
  // stack limit whatever the nesting.
  if (depth > 200 || value === null || typeof value !== 'object') return null;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const found = findLoneSurrogate(value[i], [...path, i], depth + 1);
      if (found) return found;
    }
    return null;
  }
  for (const [key, inner] of Object.entries(value)) {
    if (LONE_SURROGATE.test(key)) return { path: [...path, key], text: key, index: 0 };
    const found = findLoneSurrogate(inner, [...path, key], depth + 1);
    if (found) return found;
  }
  return null;
}

/** Names the place: a sheet block by its id and line, anything else by its field. */
function describe(found: Found, body: unknown): string {
  const [first, index, leaf] = found.path;
  if (first === 'blocks' && typeof index === 'number' && leaf === 'source') {
    const block = (body as { blocks: { id?: unknown }[] }).blocks[index];
    const id = typeof block?.id === 'string' ? block.id : String(index + 1);
    const line = found.text.slice(0, found.index).split('\n').length;
    return `Block ${id}, line ${line}`;
  }
  return found.path.length > 0 ? found.path.join('.') : 'The request body';
}

/**
 * Refuses JSON text holding a lone UTF-16 surrogate (JSON lets a client escape half a pair, as
 * "\ud800") with 422 INVALID_TEXT naming the block and line or the field: such text is not
 * Unicode, and the database's UTF-8 columns would refuse it only at the write.
 */
export const refuseInvalidText: RequestHandler = (req, _res, next) => {
  const found = findLoneSurrogate(req.body, [], 0);
  if (!found) return next();
  const field = found.path.join('.');
  next(
    new AppError(
      422,
      'INVALID_TEXT',
      `${describe(found, req.body)} holds a character that is not valid Unicode (half of a surrogate pair); retype or remove it.`,
      field ? { field } : {},
    ),
  );
};
