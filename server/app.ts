// createApp(): the Express app with every middleware and the /api router, but no listen(), so
// supertest drives it directly. server/index.ts adds the process concerns (env, migrate, listen).
import express, { type Express } from 'express';
import session from 'express-session';
import cookieParser from 'cookie-parser';
import helmet from 'helmet';
import connectSessionSequelize from 'connect-session-sequelize';
import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { Sequelize } from 'sequelize';
import { createPassport } from './auth/passport';
import type { AppContext } from './context';
import { cookiesSecure, publicUrl, type Env } from './env';
import { createLogger, type Logger } from './logger';
import type { Mailer } from './mail/mailer';
import { createCsrf } from './middleware/csrf';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { requestId } from './middleware/request-id';
import { resetRequestLimit, signInIpLimit, signInLimit } from './middleware/signin-limit';
import { buildRouter } from './routes/build-router';
import { routeTable } from './routes/route-table';
import { registerCaseEngineUsage } from './services/cases';
import { createStorage } from './storage/create-storage';
import type { ObjectStorage } from './storage/storage';

/** What createApp() needs. */
export interface CreateAppOptions {
  sequelize: Sequelize;
  env: Env;
  mailer: Mailer;
  /** Signs session cookies and CSRF tokens (server/index.ts resolves SESSION_SECRET or the stored one). */
  sessionSecret: string;
  logger?: Logger;
  /** Folder of the built client to serve with an SPA fallback; omitted = API only. */
  clientDir?: string;
  /** Capture storage; omitted = the one the env asks for (STORAGE). */
  storage?: ObjectStorage;
}

const SESSION_COOKIE = 'crankwise.sid';

/** Builds the app. Call only after the models are initialised on `sequelize` (createSequelize does it). */
export function createApp(options: CreateAppOptions): Express {
  const { sequelize, env, mailer, sessionSecret } = options;
  const logger = options.logger ?? createLogger(env.LOG_LEVEL);
  const secure = cookiesSecure(env);
  const app = express();
  app.disable('x-powered-by');
  // A case registers its engine: an engine a case uses cannot be deleted (services/engine-usage.ts).
  registerCaseEngineUsage();
  if (env.TRUST_PROXY !== undefined) {
    const hops = Number(env.TRUST_PROXY);
    app.set('trust proxy', Number.isInteger(hops) ? hops : env.TRUST_PROXY === 'true' ? true : env.TRUST_PROXY);
  }

  const SequelizeStore = connectSessionSequelize(session.Store);
  const store = new SequelizeStore({
    db: sequelize,
    table: 'Session',
    checkExpirationInterval: 15 * 60_000,
    extendDefaultFields: (defaults: { data: string; expires: Date }, data: { passport?: { user?: number } }) => ({
      ...defaults,
      userId: data.passport?.user ?? null,
    }),
  });

  const ctx: AppContext = {
    env,
    sequelize,
    mailer,
    logger,
    passport: createPassport(env.BCRYPT_ROUNDS),
    signInLimiter: signInLimit(env.SIGNIN_MAX_FAILURES, env.SIGNIN_WINDOW_MIN),
    signInIpLimiter: signInIpLimit(env.SIGNIN_IP_MAX_FAILURES, env.SIGNIN_WINDOW_MIN),
    resetLimiter: resetRequestLimit(),
    csrf: createCsrf(sessionSecret, secure),
    publicUrl: publicUrl(env),
    sessionCookie: SESSION_COOKIE,
    storage: options.storage ?? createStorage(env),
  };
  app.locals.ctx = ctx;

  app.use(requestId(logger));
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: true,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          // echarts and React set inline style attributes.
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          mediaSrc: ["'self'", 'blob:'],
          workerSrc: ["'self'", 'blob:'],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          upgradeInsecureRequests: secure ? [] : null,
        },
      },
      strictTransportSecurity: secure,
    }),
  );

  const api = express.Router();
  api.use(express.json({ limit: '200kb' }));
  api.use(cookieParser());
  api.use(
    session({
      name: SESSION_COOKIE,
      secret: sessionSecret,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      proxy: env.TRUST_PROXY !== undefined,
      cookie: { httpOnly: true, sameSite: 'lax', secure, maxAge: env.SESSION_MAX_AGE_HOURS * 3_600_000, path: '/' },
    }),
  );
  api.use(ctx.passport.initialize());
  api.use(ctx.passport.session());
  api.use((req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    if (req.user) req.log = req.log.child({ userId: req.user.id });
    next();
  });
  api.use(ctx.csrf.protect);
  api.use(buildRouter(routeTable));
  api.use(apiNotFound);
  app.use('/api', api);

  if (options.clientDir) serveClient(app, resolve(options.clientDir));
  app.use(errorHandler);
  return app;
}

/** Serves the built client with an SPA fallback to index.html for every non-API GET. */
function serveClient(app: Express, clientDir: string): void {
  const index = join(clientDir, 'index.html');
  app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
  app.use((req, res, next) => {
    if ((req.method !== 'GET' && req.method !== 'HEAD') || req.path.startsWith('/api')) return next();
    if (!existsSync(index)) {
      res.status(503).type('text/plain').send('The client is not built yet: run `npm run build` (npm start does it for you).');
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(index);
  });
}
