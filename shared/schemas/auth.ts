import { z } from 'zod';
import { EmailSchema, PasswordSchema } from './common';

/** POST /api/auth/sign-in. The password is not length-checked here: old passwords must still sign in. */
export const SignInSchema = z.object({
  email: EmailSchema,
  password: z.string().min(1, { message: 'Enter your password' }).max(200),
});
/** `{ email, password }` */
export type SignIn = z.infer<typeof SignInSchema>;

/** POST /api/auth/password-reset: always answered 202, whether or not the address is known. */
export const PasswordResetRequestSchema = z.object({ email: EmailSchema });
/** `{ email }` */
export type PasswordResetRequest = z.infer<typeof PasswordResetRequestSchema>;

/** A one-time token from an e-mailed link (base64url, 43 characters for 32 random bytes). */
export const TokenSchema = z
  .string()
  .trim()
  .min(20, { message: 'The link is incomplete; open it again from the e-mail' })
  .max(200);

/** POST /api/auth/password-reset/complete: the token from the e-mail and the new password. */
export const PasswordResetCompleteSchema = z.object({
  token: TokenSchema,
  password: PasswordSchema,
});
/** `{ token, password }` */
export type PasswordResetComplete = z.infer<typeof PasswordResetCompleteSchema>;

/** GET /api/csrf → `{ token }`; send it back as the `x-csrf-token` header on every state-changing request. */
export const CSRF_HEADER = 'x-csrf-token';
