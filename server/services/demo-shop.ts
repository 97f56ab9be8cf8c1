import type { Sequelize } from 'sequelize';
import { Shop } from '../models';
import { Engine } from '../models/engine';
import type { Role } from '../../shared/auth/roles';
import { createShop } from './create-shop';
import { seedDemoEngines } from '../db/seeders/drive-library';

/** The invented demo shop's name (no real shop, person or brand). */
export const DEMO_SHOP_NAME = 'Larkspur Lane Auto Care';

/** The demo users, one per role, with the passwords the README lists. Invented people. */
export const DEMO_USERS: ReadonlyArray<{ name: string; email: string; password: string; role: Role }> = [
  { name: 'Tess Okafor', email: 'tess.tech@demo.crankwise.test', password: 'crank-demo-tech', role: 'tech' },
  { name: 'Sid Marlow', email: 'sid.specialist@demo.crankwise.test', password: 'crank-demo-specialist', role: 'specialist' },
  { name: 'Lena Varga', email: 'lena.lead@demo.crankwise.test', password: 'crank-demo-lead', role: 'lead' },
  { name: 'Adam Pell', email: 'adam.admin@demo.crankwise.test', password: 'crank-demo-admin', role: 'admin' },
];

/**
 * Creates the demo shop and its four users unless a demo shop exists already.
 * @returns true when it was created now (npm start then prints the passwords)
 */
export async function seedDemoShop(sequelize: Sequelize, bcryptRounds: number): Promise<boolean> {
  const existing = await Shop.findOne({ where: { isDemo: true } });
  if (existing) {
    // A demo shop made before the Drive library existed gets its demo engines once; a demo shop
    // that has engines is left as it is (engines deleted on purpose do not come back).
    if ((await Engine.count({ where: { shopId: existing.id } })) === 0) await seedDemoEngines(existing.id);
    return false;
  }
  const { shop } = await createShop(sequelize, { name: DEMO_SHOP_NAME, isDemo: true, users: [...DEMO_USERS] }, bcryptRounds);
  await seedDemoEngines(shop.id); // Drive library: the three invented demo engines
  return true;
}

/**
 * DEMO=off: deletes the demo shop (rows flagged isDemo) and, through ON DELETE CASCADE, only the
 * records that belong to it. Real shops are never touched.
 * @returns the number of demo shops removed
 */
export async function removeDemoShop(): Promise<number> {
  return Shop.destroy({ where: { isDemo: true } });
}
