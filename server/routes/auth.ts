import type { RequestHandler } from 'express';
import { PasswordResetCompleteSchema, PasswordResetRequestSchema, SignInSchema } from '../../shared/schemas/auth';
import type { SessionUser } from '../auth/passport';
import { appContext } from '../context';
import { AppError } from '../errors';
import { validate } from '../middleware/validate';
import { presentUser } from '../presenters/present-user';
import { completePasswordReset, requestPasswordReset } from '../services/password-reset';
import type { RouteRow } from './route-row';

const signIn: RequestHandler = (req, res, next) => {
  const { passport } = appContext(req);
  passport.authenticate('local', { session: false }, (err: unknown, user: SessionUser | false, info?: { message?: string }) => {
    if (err) return next(err);
    if (!user && info?.message === 'deactivated') {
      return next(new AppError(403, 'account_deactivated', "This account is deactivated. Ask your shop's admin to turn it back on."));
    }
    if (!user) return next(new AppError(401, 'invalid_credentials', 'E-mail or password is wrong'));
    // passport ≥0.6 regenerates the session id here (session-fixation defence).
    req.logIn(user, (loginError) => {
      if (loginError) return next(loginError);
      res.json({ user: presentUser(user) });
    });
  })(req, res, next);
};

const signOut: RequestHandler = (req, res, next) => {
  const { sessionCookie } = appContext(req);
  req.logout((logoutError) => {
    if (logoutError) return next(logoutError);
    req.session.destroy((destroyError) => {
      if (destroyError) return next(destroyError);
      res.clearCookie(sessionCookie, { path: '/' });
      res.status(204).end();
    });
  });
};

/** Sign-in, sign-out, the current user and password reset. */
export const authRoutes: RouteRow[] = [
  {
    method: 'post',
    path: '/auth/sign-in',
    roles: 'public',
    summary: 'sign in with e-mail and password',
    handlers: [
      validate({ body: SignInSchema }),
      (req, res, next) => appContext(req).signInIpLimiter(req, res, next),
      (req, res, next) => appContext(req).signInLimiter(req, res, next),
      signIn,
    ],
  },
  {
    method: 'post',
    path: '/auth/sign-out',
    roles: 'public',
    summary: 'sign out (ends the server session; harmless when already signed out)',
    handlers: [signOut],
  },
  {
    method: 'get',
    path: '/auth/me',
    roles: 'signed-in',
    summary: 'the signed-in user',
    handlers: [(req, res) => void res.json({ user: presentUser(req.user!) })],
  },
  {
    method: 'post',
    path: '/auth/password-reset',
    roles: 'public',
    summary: 'e-mail a password-reset link (always 202)',
    handlers: [
      validate({ body: PasswordResetRequestSchema }),
      (req, res, next) => appContext(req).resetLimiter(req, res, next),
      (req, res) => {
        const ctx = appContext(req);
        // Reply before the lookup and the mail so the answer says nothing about the address.
        res.status(202).end();
        requestPasswordReset(ctx, req.body.email).catch((error: unknown) =>
          req.log.error('password reset mail failed', { error }),
        );
      },
    ],
  },
  {
    method: 'post',
    path: '/auth/password-reset/complete',
    roles: 'public',
    summary: 'set a new password with a reset token',
    handlers: [
      validate({ body: PasswordResetCompleteSchema }),
      async (req, res) => {
        const ctx = appContext(req);
        await completePasswordReset(ctx.sequelize, req.body, ctx.env.BCRYPT_ROUNDS);
        res.status(204).end();
      },
    ],
  },
];
