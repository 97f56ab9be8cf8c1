// CSRF protection by double submit (csrf-csrf): GET /api/csrf hands out a token bound to the
// session id, stored HMAC'd in a cookie; every state-changing request must echo it in x-csrf-token.
import type { RequestHandler } from 'express';
import { doubleCsrf } from 'csrf-csrf';
import type {} from 'express-session';
import { AppError } from '../errors';

/** The CSRF pieces the app wires in. */
export interface Csrf {
  /** Rejects POST/PUT/PATCH/DELETE without a valid token: 403 `csrf_invalid`. */
  protect: RequestHandler;
  /** GET /api/csrf handler → `{ token }`. */
  issue: RequestHandler;
}

/** Builds the CSRF middleware. `secure` adds the __Host- prefix and the Secure flag. */
export function createCsrf(secret: string, secure: boolean): Csrf {
  const { doubleCsrfProtection, generateCsrfToken } = doubleCsrf({
    getSecret: () => secret,
    // The session id changes at sign-in (fixation defence), so a token fetched before must be refetched.
    getSessionIdentifier: (req) => req.session?.id ?? '',
    cookieName: secure ? '__Host-crankwise.csrf' : 'crankwise.csrf',
    cookieOptions: { sameSite: 'lax', path: '/', secure, httpOnly: true },
    getCsrfTokenFromRequest: (req) => req.get('x-csrf-token'),
  });
  return {
    protect: (req, res, next) => {
      doubleCsrfProtection(req, res, (err?: unknown) => {
        if (err) next(new AppError(403, 'csrf_invalid', 'The form expired; reload the page and try again'));
        else next();
      });
    },
    issue: (req, res) => {
      // Mark the session so express-session keeps it (and its id) for a signed-out visitor too.
      req.session.csrf = true;
      res.json({ token: generateCsrfToken(req, res, { overwrite: false, validateOnReuse: false }) });
    },
  };
}

declare module 'express-session' {
  interface SessionData {
    csrf?: boolean;
  }
}
