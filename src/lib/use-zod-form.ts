import { useState } from 'react';
import { z } from 'zod';
import { ApiError } from './api-client';

type Errors = Record<string, string | undefined>;

/**
 * Form state validated by the same zod schema the server uses. Field errors come from the
 * schema on submit, or from the server's answer when it refuses.
 */
export function useZodForm<Schema extends z.ZodType>(schema: Schema, initial: z.input<Schema>) {
  const [values, setValues] = useState<z.input<Schema>>(initial);
  const [errors, setErrors] = useState<Errors>({});
  const [formError, setFormError] = useState<string | null>(null);

  const set = <Key extends keyof z.input<Schema>>(key: Key, value: z.input<Schema>[Key]) => {
    setValues((current) => ({ ...(current as object), [key]: value }) as z.input<Schema>);
    setErrors((current) => ({ ...current, [key as string]: undefined }));
  };

  /** Returns the parsed values, or null after showing the errors. */
  const validate = (): z.output<Schema> | null => {
    const result = schema.safeParse(values);
    if (result.success) {
      setErrors({});
      setFormError(null);
      return result.data;
    }
    const flat = z.flattenError(result.error);
    const next: Errors = {};
    for (const [key, messages] of Object.entries(flat.fieldErrors)) {
      next[key] = (messages as string[] | undefined)?.[0];
    }
    setErrors(next);
    setFormError(flat.formErrors[0] ?? null);
    return null;
  };

  const showServerError = (error: unknown) => {
    if (error instanceof ApiError) {
      const next: Errors = {};
      for (const [key, messages] of Object.entries(error.fieldErrors)) next[key] = messages?.[0];
      setErrors(next);
      setFormError(error.message);
    } else {
      setFormError('Something went wrong. Please try again.');
    }
  };

  return { values, set, errors, formError, setFormError, validate, showServerError, setValues };
}
