import type { RequestHandler } from 'express';
import { SetupSchema } from '../../shared/schemas/setup';
import { appContext } from '../context';
import { validate } from '../middleware/validate';
import { presentUser } from '../presenters/present-user';
import { needsSetup, runSetup } from '../services/setup';
import type { RouteRow } from './route-row';

const setUp: RequestHandler = async (req, res, next) => {
  const ctx = appContext(req);
  const admin = await runSetup(ctx.sequelize, req.body, ctx.env.BCRYPT_ROUNDS);
  req.logIn(admin as Express.User, (error) => {
    if (error) return next(error);
    res.status(201).json({ user: presentUser(admin) });
  });
};

/** First-run set-up of the first real shop. */
export const setupRoutes: RouteRow[] = [
  {
    method: 'get',
    path: '/setup/status',
    roles: 'public',
    summary: 'whether the first-run set-up is still open',
    handlers: [async (_req, res) => void res.json({ needsSetup: await needsSetup() })],
  },
  {
    method: 'post',
    path: '/setup',
    roles: 'public',
    summary: 'create the first shop and its admin (only while no real shop exists)',
    handlers: [validate({ body: SetupSchema }), setUp],
  },
];
