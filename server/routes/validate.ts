import type { z } from 'zod';
import { ValidationError } from '../errors';

/**
 * Parses a request part with a zod schema from shared/, or throws a 400 naming the first problem
 * and the field it concerns.
 *
 * @example
 * const { role } = parse(changeRoleSchema, req.body);
 * const { id } = parse(userParamsSchema, req.params);
 */
export function parse<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
  const result = schema.safeParse(input ?? {});
  if (result.success) return result.data;
  const issue = result.error.issues[0];
  const field = issue.path.length ? issue.path.join('.') : undefined;
  throw new ValidationError(field ? `${field}: ${issue.message}` : issue.message, field);
}
