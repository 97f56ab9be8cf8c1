/**
 * What else in the shop refers to an engine. Cases do not exist yet (a later Cases issue adds
 * them): until then no case can use an engine, and the Cases issue replaces the body of
 * `countCasesUsingEngine` with a count of its rows. The delete service already refuses on it.
 */
import type { Transaction } from 'sequelize';

/**
 * Number of the shop's cases that use the engine; deleting is refused while it is above 0.
 * Returns 0 until the Cases issue adds the cases table (TODO(cases issue): count cases.engineId).
 */
export async function countCasesUsingEngine(shopId: number, engineId: number, transaction?: Transaction): Promise<number> {
  void shopId;
  void engineId;
  void transaction;
  return 0;
}
