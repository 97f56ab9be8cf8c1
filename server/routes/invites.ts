import { ADMIN_ONLY } from '../../shared/auth/access';
import { AcceptInviteSchema, CreateInviteSchema, InviteTokenParamsSchema } from '../../shared/schemas/invites';
import { appContext } from '../context';
import { validate } from '../middleware/validate';
import type { Invite } from '../models';
import { presentInvite } from '../presenters/present-invite';
import { presentUser } from '../presenters/present-user';
import { acceptInvite, createInvite, inviteInfo, listInvites } from '../services/invites';
import type { RouteRow } from './route-row';

/** Invitations: admins send and revoke them; the invitee reads and accepts one with its token. */
export const inviteRoutes: RouteRow[] = [
  {
    method: 'get',
    path: '/invites',
    roles: ADMIN_ONLY,
    summary: "the shop's invitations",
    handlers: [async (req, res) => void res.json({ items: (await listInvites(req.user!.shopId)).map(presentInvite) })],
  },
  {
    method: 'post',
    path: '/invites',
    roles: ADMIN_ONLY,
    summary: 'invite someone by e-mail',
    handlers: [
      validate({ body: CreateInviteSchema }),
      async (req, res) => {
        const invite = await createInvite(appContext(req), req.user!, req.body);
        res.status(201).json({ invite: presentInvite(invite) });
      },
    ],
  },
  {
    method: 'delete',
    path: '/invites/:id',
    roles: ADMIN_ONLY,
    ownedParam: 'id',
    resource: 'invite',
    summary: 'revoke an invitation',
    handlers: [
      async (_req, res) => {
        await (res.locals.owned as Invite).destroy();
        res.status(204).end();
      },
    ],
  },
  {
    method: 'get',
    path: '/invites/:token/info',
    roles: 'public',
    summary: 'what an invitation link is for',
    handlers: [
      validate({ params: InviteTokenParamsSchema }),
      async (req, res) => void res.json(await inviteInfo(String(req.params.token))),
    ],
  },
  {
    method: 'post',
    path: '/invites/accept',
    roles: 'public',
    summary: 'accept an invitation: set name and password, once',
    handlers: [
      validate({ body: AcceptInviteSchema }),
      async (req, res, next) => {
        const ctx = appContext(req);
        const user = await acceptInvite(ctx.sequelize, req.body, ctx.env.BCRYPT_ROUNDS);
        req.logIn(user as Express.User, (error) => {
          if (error) return next(error);
          res.json({ user: presentUser(user) });
        });
      },
    ],
  },
];
