// What route handlers and services need from the running app, kept on app.locals.ctx.
import type { Request, RequestHandler } from 'express';
import type passportModule from 'passport';
import type { Sequelize } from 'sequelize';
import type { Env } from './env';
import type { Logger } from './logger';
import type { Mailer } from './mail/mailer';
import type { Csrf } from './middleware/csrf';
import type { ObjectStorage } from './storage/storage';

/** The app's collaborators, built once by createApp(). */
export interface AppContext {
  env: Env;
  sequelize: Sequelize;
  mailer: Mailer;
  logger: Logger;
  passport: passportModule.Authenticator;
  /** Failed sign-ins per IP + e-mail. */
  signInLimiter: RequestHandler;
  /** Failed sign-ins per IP across addresses (password spraying); runs before signInLimiter. */
  signInIpLimiter: RequestHandler;
  resetLimiter: RequestHandler;
  csrf: Csrf;
  /** Base URL for e-mailed links, without a trailing slash. */
  publicUrl: string;
  /** Name of the session cookie (cleared at sign-out). */
  sessionCookie: string;
  /** Where capture files are stored (server/storage). */
  storage: ObjectStorage;
  /** The in-process job runner, when one runs (woken after an upload so it need not wait for its poll). */
  jobs?: { wake(): void };
}

/** The context of the app serving `req`. */
export function appContext(req: Request): AppContext {
  return req.app.locals.ctx as AppContext;
}
