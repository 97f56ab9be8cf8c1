/**
 * Common firing orders by cylinder count, used when none is given (the cycle view then says so
 * in `warnings`). These are the orders most engines of that count use [common practice]; an
 * engine's own order comes from its drive document or --firing-order.
 */
const COMMON: Record<number, number[]> = {
  1: [1],
  2: [1, 2],
  3: [1, 3, 2],
  4: [1, 3, 4, 2],
  5: [1, 2, 4, 5, 3],
  6: [1, 5, 3, 6, 2, 4],
  8: [1, 8, 4, 3, 6, 5, 7, 2],
  10: [1, 6, 5, 10, 2, 7, 3, 8, 4, 9],
  12: [1, 7, 5, 11, 3, 9, 6, 12, 2, 8, 4, 10],
};

/** The common firing order for a cylinder count (1..cylinders in sequence where none is common). */
export function commonFiringOrder(cylinders: number): number[] {
  if (!Number.isInteger(cylinders) || cylinders < 1) throw new RangeError(`cylinder count must be a positive integer, got ${cylinders}`);
  return COMMON[cylinders] ?? Array.from({ length: cylinders }, (_, i) => i + 1);
}
