import { ApiError } from './api-client';

/**
 * Field messages of a 400 `validation_failed` keyed by the full dotted path ("vehicle.make"), for
 * react-hook-form's setError; anything else as one message.
 */
export function apiFieldErrors(error: unknown): { fields: Record<string, string>; message: string | null } {
  const fields: Record<string, string> = {};
  if (error instanceof ApiError) {
    if (error.code === 'validation_failed' && Array.isArray(error.details)) {
      for (const issue of error.details as { path?: unknown; message?: unknown }[]) {
        const path = Array.isArray(issue.path) ? issue.path.join('.') : typeof issue.path === 'string' ? issue.path : '';
        if (path && typeof issue.message === 'string' && !(path in fields)) fields[path] = issue.message;
      }
      if (Object.keys(fields).length > 0) return { fields, message: null };
    }
    return { fields, message: error.message };
  }
  return { fields, message: error instanceof Error ? error.message : 'Something went wrong. Try again.' };
}
