/**
 * What else in the shop refers to an engine. Cases do not exist yet: the Cases issue registers a
 * counter here (`registerEngineUsage('case', (shopId, engineId, t) => Case.count(…))`) at start-up,
 * and deleting an engine is then refused while any counter is above 0. Until then nothing uses an
 * engine and `countCasesUsingEngine` returns 0.
 */
import type { Transaction } from 'sequelize';

/** Counts the records of one kind (e.g. cases) that use an engine of a shop. */
export type EngineUsageCounter = (shopId: number, engineId: number, transaction?: Transaction) => Promise<number>;

const counters = new Map<string, EngineUsageCounter>();

/** Registers (or replaces) the counter of one kind of record; returns a function that removes it. */
export function registerEngineUsage(kind: string, counter: EngineUsageCounter): () => void {
  counters.set(kind, counter);
  return () => {
    if (counters.get(kind) === counter) counters.delete(kind);
  };
}

/** Number of the shop's records (cases) that use the engine; deleting is refused while it is above 0. */
export async function countCasesUsingEngine(shopId: number, engineId: number, transaction?: Transaction): Promise<number> {
  let total = 0;
  for (const count of counters.values()) total += await count(shopId, engineId, transaction);
  return total;
}
