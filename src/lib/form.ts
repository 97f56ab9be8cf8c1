import type { z } from 'zod';
import { ApiError } from './api-client';

/** The string fields of a submitted form, by input name. */
export function formValues(form: HTMLFormElement): Record<string, string> {
  const values: Record<string, string> = {};
  new FormData(form).forEach((value, key) => {
    if (typeof value === 'string') values[key] = value;
  });
  return values;
}

/** Result of checking form values against a shared request schema before sending them. */
export type Checked<T> = { ok: true; data: T } | { ok: false; errors: Record<string, string> };

/**
 * Parses form values with the same zod schema the server validates with (shared/schemas), so a
 * form shows the same message next to the field before and after a round trip.
 */
export function checkWith<S extends z.ZodType>(schema: S, values: unknown): Checked<z.output<S>> {
  const result = schema.safeParse(values);
  if (result.success) return { ok: true, data: result.data };
  const errors: Record<string, string> = {};
  for (const issue of result.error.issues) {
    const key = String(issue.path[0] ?? 'form');
    errors[key] ??= issue.message;
  }
  return { ok: false, errors };
}

/**
 * What a form shows after a failed request: field messages from a 400 `validation_failed` next to
 * their inputs, everything else as one message above the buttons.
 */
export function formErrorsFrom(error: unknown): { fields: Record<string, string>; message?: string } {
  if (error instanceof ApiError) {
    const fields = error.fieldErrors();
    if (error.code === 'validation_failed' && Object.keys(fields).length > 0) {
      return { fields, message: fields['(body)'] ?? fields.form };
    }
    return { fields: {}, message: error.message };
  }
  return { fields: {}, message: error instanceof Error ? error.message : 'Something went wrong. Try again.' };
}
