import { ADMIN_ONLY } from '../../shared/auth/access';
import { UpdateUserSchema } from '../../shared/schemas/users';
import { appContext } from '../context';
import { validate } from '../middleware/validate';
import type { User } from '../models';
import { presentUser } from '../presenters/present-user';
import { listUsers, updateUser } from '../services/users';
import type { RouteRow } from './route-row';

/** The Team screen: list users, change role, name or active flag. */
export const userRoutes: RouteRow[] = [
  {
    method: 'get',
    path: '/users',
    roles: ADMIN_ONLY,
    summary: "the shop's users",
    handlers: [async (req, res) => void res.json({ items: (await listUsers(req.user!.shopId)).map((u) => presentUser(u)) })],
  },
  {
    method: 'patch',
    path: '/users/:id',
    roles: ADMIN_ONLY,
    ownedParam: 'id',
    resource: 'user',
    summary: "change a user's role, name or active flag",
    handlers: [
      validate({ body: UpdateUserSchema }),
      async (req, res) => {
        const user = await updateUser(appContext(req).sequelize, req.user!, res.locals.owned as User, req.body);
        res.json({ user: presentUser(user) });
      },
    ],
  },
];
