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

/**
 * A number field's value for a zod schema: an empty field is `undefined` (so optional fields fall
 * back to their default), anything else goes through Number() and lets the schema judge it.
 *
 * @example
 * optionalNumber('0.85') // 0.85
 * optionalNumber('')     // undefined
 */
export function optionalNumber(value: FormDataEntryValue | null): number | undefined {
  if (typeof value !== 'string' || value.trim() === '') return undefined;
  return Number(value);
}

/**
 * A textarea's non-empty lines, trimmed (ignore lists, one pattern a line).
 *
 * @example
 * nonEmptyLines('dist/\n\n  *.min.js ') // ['dist/', '*.min.js']
 */
export function nonEmptyLines(value: FormDataEntryValue | null): string[] {
  if (typeof value !== 'string') return [];
  return value
    .split(/\r?\n/)
    .map((line) => line.trim())
    .filter((line) => line.length > 0);
}
