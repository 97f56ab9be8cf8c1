import type { Sequelize } from 'sequelize';
import { AppError } from '../errors';
import { Shop, type User } from '../models';
import type { Setup } from '../../shared/schemas/setup';
import { createShop } from './create-shop';

/** True while no shop exists other than the demo shop: the first-run set-up is then offered. */
export async function needsSetup(): Promise<boolean> {
  return (await Shop.count({ where: { isDemo: false } })) === 0;
}

/**
 * First-run set-up: creates the first real shop and its admin. Refused with 409 `setup_done`
 * once any non-demo shop exists (later shops come from `npm run create-shop`).
 * @returns the new admin (with `shop` set)
 */
export async function runSetup(sequelize: Sequelize, input: Setup, bcryptRounds: number): Promise<User> {
  if (!(await needsSetup())) throw new AppError(409, 'setup_done', 'This installation is already set up; sign in instead');
  const { users } = await createShop(
    sequelize,
    { name: input.shopName, users: [{ name: input.adminName, email: input.adminEmail, password: input.password, role: 'admin' }] },
    bcryptRounds,
  );
  return users[0]!;
}
