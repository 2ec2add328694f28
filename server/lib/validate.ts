import { z } from 'zod';
import { findControlCharacters } from './control-characters';
import { AppError } from './errors';

/**
 * Parses input at the edge; a failure becomes a 400 with a message per field. Control
 * characters are refused first, for every field of every schema, so no route needs to
 * remember them.
 */
export function parseInput<Schema extends z.ZodType>(
  schema: Schema,
  input: unknown,
): z.output<Schema> {
  const controlIssues = findControlCharacters(input, schema);
  if (controlIssues.length > 0) {
    const fieldErrors: Record<string, string[]> = {};
    for (const issue of controlIssues) (fieldErrors[issue.field] ??= []).push(issue.message);
    throw new AppError('invalid_input', 400, 'Some fields need attention.', {
      fieldErrors,
      formErrors: [],
    });
  }
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const flat = z.flattenError(result.error);
  throw new AppError('invalid_input', 400, 'Some fields need attention.', {
    fieldErrors: flat.fieldErrors,
    formErrors: flat.formErrors,
  });
}

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A path id that is not even well formed names nothing: answer 404, as for an unknown one. */
export function parseId(value: unknown, what: string): string {
  if (typeof value !== 'string' || !uuidPattern.test(value)) {
    throw new AppError('not_found', 404, `${what} was not found.`);
  }
  return value.toLowerCase();
}
