import type { z } from 'zod';

/** Field → first message, from a zod schema (the same schema the server validates with). */
export type FieldErrors = Record<string, string>;

/**
 * Validates form values with a shared schema; gives the parsed data or the errors by field.
 *
 * @example
 * const result = validate(signInSchema, { email, password });
 * if (!result.ok) setErrors(result.errors);
 */
export function validate<S extends z.ZodType>(
  schema: S,
  values: unknown,
): { ok: true; data: z.output<S> } | { ok: false; errors: FieldErrors } {
  const result = schema.safeParse(values);
  if (result.success) return { ok: true, data: result.data };
  const errors: FieldErrors = {};
  for (const issue of result.error.issues) {
    const key = issue.path.join('.') || '_';
    errors[key] ??= issue.message;
  }
  return { ok: false, errors };
}
