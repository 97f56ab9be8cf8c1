// Seeds the demo shop's Drive library with the three invented demo engines. (Every shop's published
// bearing rows are seeded by services/bearings.ts seedPublishedBearings, called from createShop.)
import { Engine } from '../../models/engine';
import { createEngine } from '../../services/engines';
import { DEMO_ENGINE_NOTE, DEMO_ENGINES } from './demo-engines';

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
