// Seeds a shop's Drive library: the published bearing rows (every shop, at creation) and the
// three invented demo engines (the demo shop only).
import type { Transaction } from 'sequelize';
import { Engine } from '../../models/engine';
import { seedPublishedBearings } from '../../services/bearings';
import { createEngine } from '../../services/engines';
import { DEMO_ENGINE_NOTE, DEMO_ENGINES } from './demo-engines';

export { seedPublishedBearings };

/**
 * Adds the demo engines to a shop unless it already has engines of those names. Each is stored
 * through the same service as the API (validated, one transaction per engine), with notes saying
 * the values are invented. Returns how many were added.
 */
export async function seedDemoEngines(shopId: number): Promise<number> {
  let added = 0;
  for (const doc of DEMO_ENGINES) {
    const exists = await Engine.count({ where: { shopId, nameKey: doc.name.toLowerCase() } });
    if (exists > 0) continue;
    await createEngine(shopId, { ...doc, notes: DEMO_ENGINE_NOTE });
    added += 1;
  }
  return added;
}

/** Everything a new shop's Drive library starts with (for shop-creation code holding a transaction). */
export async function seedNewShopDriveLibrary(shopId: number, transaction?: Transaction): Promise<void> {
  await seedPublishedBearings(shopId, transaction);
}
