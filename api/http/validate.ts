import { ZodError, z } from 'zod';
import { ValidationError } from './errors';

type Where = 'body' | 'params' | 'query';

const placeName: Record<Where, string> = {
  body: 'the request body',
  params: 'the address',
  query: 'the query string',
};

/** Turns a zod refusal into the API's 422: `field` is the first offending path joined with '.'. */
export function validationErrorFrom(error: ZodError, where: Where = 'body'): ValidationError {
  const issues = error.issues.map((issue) => ({
    field: issue.path.map(String).join('.'),
    message: issue.message,
    code: issue.code,
  }));
  const first = issues[0];
  const field = first?.field || undefined;
  const message = first
    ? field
      ? `${field}: ${first.message}`
      : `${capitalise(placeName[where])} is not valid: ${first.message}`
    : `${capitalise(placeName[where])} is not valid.`;
  return new ValidationError(message, { ...(field ? { field } : {}), details: { issues } });
}

/** Parses a request part with its zod schema, throwing the 422 above on refusal. */
export function parse<S extends z.ZodType>(
  schema: S,
  value: unknown,
  where: Where = 'body',
): z.output<S> {
  const result = schema.safeParse(value);
  if (!result.success) throw validationErrorFrom(result.error, where);
  return result.data;
}

export function isZodError(e: unknown): e is ZodError {
  return e instanceof ZodError;
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** A positive whole id in the address (`:projectId`, `:sheetId`, …), named by `label`. */
export const idParam = (label: string) =>
  z.coerce
    .number({ error: `The ${label} in the address must be a whole number.` })
    .int({ error: `The ${label} in the address must be a whole number.` })
    .positive({ error: `The ${label} in the address must be a whole number above 0.` })
    .max(4294967295, { error: `The ${label} in the address is too large.` });
