import { isApiError } from './api-client';

/**
 * Splits a server error between the form's inputs: the message goes by the named input when the
 * server names one this form has, otherwise to the form as a whole.
 */
export function splitFormError(
  error: unknown,
  fields: readonly string[],
): { fieldErrors: Record<string, string>; formError: string | null } {
  if (!error) return { fieldErrors: {}, formError: null };
  if (isApiError(error)) {
    // A nested path such as `roles.0` belongs to the `roles` input.
    const field = error.field
      ? fields.find((f) => error.field === f || error.field?.startsWith(`${f}.`))
      : undefined;
    if (field) return { fieldErrors: { [field]: error.message }, formError: null };
    return { fieldErrors: {}, formError: error.message };
  }
  return {
    fieldErrors: {},
    formError: error instanceof Error ? error.message : 'Something went wrong.',
  };
}
