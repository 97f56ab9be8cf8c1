import { z } from 'zod';

/**
 * A record id in a path parameter (`/users/:id`): only a canonical positive integer that fits an INT
 * column (`0x1`, `1e0`, `+1`, ` 1`, `01` are refused, though Number() reads each as 1).
 */
export const IdSchema = z
  .string()
  .regex(/^[1-9][0-9]{0,9}$/, { message: 'expected a positive whole number' })
  .transform(Number)
  .refine((n) => n <= 2_147_483_647, { message: 'expected a positive whole number' });
/** `:id` path parameters. */
export const IdParamsSchema = z.object({ id: IdSchema });
/** Parsed `:id` params. */
export type IdParams = z.infer<typeof IdParamsSchema>;

/** An e-mail address, trimmed and lower-cased so that sign-in, invites and rate limits agree. */
export const EmailSchema = z
  .string()
  .trim()
  .max(254)
  .pipe(z.email({ message: 'Enter a valid e-mail address' }))
  .transform((s) => s.toLowerCase());

/** Minimum password length; the server and the client forms use the same number. */
export const PASSWORD_MIN_LENGTH = 10;

/** A new password: 10 to 200 characters (bcrypt reads only the first 72 bytes; the cap stops abuse). */
export const PasswordSchema = z
  .string()
  .min(PASSWORD_MIN_LENGTH, { message: `Use at least ${PASSWORD_MIN_LENGTH} characters` })
  .max(200, { message: 'Use at most 200 characters' });

/** A person's display name, 1 to 100 characters after trimming. */
export const PersonNameSchema = z
  .string()
  .trim()
  .min(1, { message: 'Enter a name' })
  .max(100, { message: 'Use at most 100 characters' });

/** The one error body every API error uses: `{ error: { code, message, details? } }`. */
export const ApiErrorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.unknown().optional(),
  }),
});
/** The parsed error body. */
export type ApiErrorBody = z.infer<typeof ApiErrorBodySchema>;

/** A list response: `{ items: T[] }`. */
export interface ListResponse<T> {
  items: T[];
}
