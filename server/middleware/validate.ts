// validate(): parses params, query and body with zod schemas from shared/schemas and replaces them
// with the parsed values; a failure becomes 400 `validation_failed` naming the field.
import type { RequestHandler } from 'express';
import type { ZodType } from 'zod';
import { zodToAppError } from './error-handler';

/** The schemas to apply; any may be omitted. */
export interface ValidateSchemas {
  params?: ZodType;
  query?: ZodType;
  body?: ZodType;
}

/** Validated values live on res.locals.valid (Express 5 makes req.query read-only). */
export function validate(schemas: ValidateSchemas): RequestHandler {
  return (req, res, next) => {
    const valid: Record<string, unknown> = { ...(res.locals.valid ?? {}) };
    for (const where of ['params', 'query', 'body'] as const) {
      const schema = schemas[where];
      if (!schema) continue;
      const result = schema.safeParse(req[where] ?? {});
      if (!result.success) {
        next(zodToAppError(result.error, where));
        return;
      }
      valid[where] = result.data;
    }
    res.locals.valid = valid;
    if (valid.body !== undefined) req.body = valid.body;
    if (valid.params !== undefined) Object.assign(req.params, valid.params);
    next();
  };
}
