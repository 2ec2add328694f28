import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { lineBreakFields } from '../schemas/common';
import { AppError } from './errors';

/**
 * Control characters in text a person sends. NUL makes PostgreSQL refuse the statement (a 500
 * and, on a tablet, an outbox stuck retrying); the others are invisible, break CSV and logs, and
 * are never part of a name, a token or a search. Tab, line feed and carriage return are allowed
 * only in fields marked with allowLineBreaks.
 */
// eslint-disable-next-line no-control-regex
const alwaysRefused = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;
const lineBreaks = /[\t\n\r]/;

export const controlCharacterMessage =
  'Remove the control characters (invisible characters such as NUL) from this field.';
export const lineBreakMessage = 'This field must be a single line without tabs.';

export interface ControlCharacterIssue {
  /** Where the text sits, e.g. `name` or `rows.3.email`. */
  field: string;
  message: string;
}

/** Only the never-allowed ones: used where no schema says what a field is (paths, raw query). */
export function hasRefusedControlCharacter(text: string): boolean {
  return alwaysRefused.test(text);
}

/**
 * Every string in the input with a control character its field does not allow. The schema is
 * walked beside the input only to learn which fields accept line breaks.
 */
export function findControlCharacters(
  input: unknown,
  schema: z.ZodType | undefined,
  path: Array<string | number> = [],
  issues: ControlCharacterIssue[] = [],
): ControlCharacterIssue[] {
  if (typeof input === 'string') {
    const field = path.join('.') || 'value';
    if (alwaysRefused.test(input)) issues.push({ field, message: controlCharacterMessage });
    else if (lineBreaks.test(input) && !acceptsLineBreaks(schema)) {
      issues.push({ field, message: lineBreakMessage });
    }
  } else if (Array.isArray(input)) {
    input.forEach((item, index) =>
      findControlCharacters(item, childSchema(schema, index), [...path, index], issues),
    );
  } else if (typeof input === 'object' && input !== null) {
    for (const [key, value] of Object.entries(input)) {
      if (alwaysRefused.test(key))
        issues.push({ field: [...path, key].join('.'), message: controlCharacterMessage });
      findControlCharacters(value, childSchema(schema, key), [...path, key], issues);
    }
  }
  return issues;
}

/** The zod 4 definition fields we follow; anything else ends the walk (strictest rule). */
interface SchemaDefinition {
  type?: string;
  innerType?: z.ZodType;
  in?: z.ZodType;
  shape?: Record<string, z.ZodType>;
  element?: z.ZodType;
  valueType?: z.ZodType;
  options?: z.ZodType[];
  left?: z.ZodType;
  right?: z.ZodType;
  catchall?: z.ZodType;
  getter?: () => z.ZodType;
}

const definitionOf = (schema: z.ZodType) => schema._zod.def as SchemaDefinition;

/** The schema and every wrapper-free form of it (optional, default, pipe, union, lazy...). */
function variants(schema: z.ZodType | undefined, seen = new Set<z.ZodType>()): z.ZodType[] {
  if (!schema || seen.has(schema)) return [];
  seen.add(schema);
  const def = definitionOf(schema);
  const inner = [
    def.innerType,
    def.in,
    def.left,
    def.right,
    def.getter?.(),
    ...(def.options ?? []),
  ];
  return [schema, ...inner.flatMap((next) => variants(next, seen))];
}

function acceptsLineBreaks(schema: z.ZodType | undefined): boolean {
  return variants(schema).some((variant) => lineBreakFields.has(variant));
}

function childSchema(schema: z.ZodType | undefined, key: string | number): z.ZodType | undefined {
  for (const variant of variants(schema)) {
    const def = definitionOf(variant);
    if (def.type === 'object') {
      const child = typeof key === 'string' ? def.shape?.[key] : undefined;
      if (child ?? def.catchall) return child ?? def.catchall;
    }
    if (def.type === 'array' && typeof key === 'number') return def.element;
    if (def.type === 'record') return def.valueType;
  }
  return undefined;
}

/** Strings anywhere in a parsed query or JSON body with a never-allowed control character. */
function refusedFields(value: unknown, path: string[], found: string[]): string[] {
  if (typeof value === 'string') {
    if (alwaysRefused.test(value)) found.push(path.join('.') || 'value');
  } else if (typeof value === 'object' && value !== null && !Buffer.isBuffer(value)) {
    for (const [key, item] of Object.entries(value)) refusedFields(item, [...path, key], found);
  }
  return found;
}

function decodedPath(path: string): string {
  try {
    return decodeURIComponent(path);
  } catch {
    // Express answers a malformed escape itself when it decodes the parameter.
    return path;
  }
}

/**
 * The net under parseInput: path segments (pass and link tokens, rendition names), raw query
 * strings and JSON bodies are checked before any route runs, so a route that reads a value
 * without a schema still cannot hand a NUL to PostgreSQL.
 */
export const refuseControlCharacters: RequestHandler = (req, _res, next) => {
  const fields = [
    ...(hasRefusedControlCharacter(decodedPath(req.path)) ? ['path'] : []),
    ...refusedFields(req.query, [], []),
    ...refusedFields(req.body, [], []),
  ];
  if (fields.length === 0) {
    next();
    return;
  }
  next(
    new AppError('invalid_input', 400, 'Some fields need attention.', {
      fieldErrors: Object.fromEntries(fields.map((field) => [field, [controlCharacterMessage]])),
      formErrors: [],
    }),
  );
};
