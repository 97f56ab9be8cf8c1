/**
 * Condition comparison (issue 16 item 5): the lines of two captures of one case (A/C clutch on vs
 * off, belt on vs off, before vs after repair) matched by order, listing those that appear, vanish
 * or change by more than 6 dB (20·log10 of the amplitude ratio).
 */
import type { Peak } from '../analysis/types';

/** Least change reported (dB). */
export const CHANGE_DB = 6;

/** One line difference between capture A and capture B. */
export interface LineDifference {
  spectrum: 'orders' | 'envelope';
  order: number;
  kind: 'appears' | 'vanishes' | 'louder' | 'quieter';
  /** SNR over the floor in A and B (null where absent). */
  snrA: number | null;
  snrB: number | null;
  /** 20·log10(B / A) when both are present. */
  changeDb: number | null;
}

/**
 * Matches peaks of A and B within `tolOrders` (at least the resolution; 0.5 % of the order for
 * high orders, whose lines drift with rpm) and lists what differs.
 */
export function compareLines(a: readonly Peak[], b: readonly Peak[], spectrum: 'orders' | 'envelope', resolution: number, minSnrDb = 6): LineDifference[] {
  const A = a.filter((p) => p.snrDb >= minSnrDb);
  const B = b.filter((p) => p.snrDb >= minSnrDb);
  const tol = (order: number) => Math.max(resolution * 1.5, order * 0.005);
  const usedB = new Set<number>();
  const out: LineDifference[] = [];
  for (const pa of A) {
    let best = -1;
    for (let j = 0; j < B.length; j += 1) {
      if (usedB.has(j)) continue;
      if (Math.abs(B[j]!.order - pa.order) <= tol(pa.order) && (best < 0 || Math.abs(B[j]!.order - pa.order) < Math.abs(B[best]!.order - pa.order))) best = j;
    }
    if (best < 0) {
      out.push({ spectrum, order: pa.order, kind: 'vanishes', snrA: pa.snrDb, snrB: null, changeDb: null });
      continue;
    }
    usedB.add(best);
    const pb = B[best]!;
    const change = pa.amplitude > 0 && pb.amplitude > 0 ? 20 * Math.log10(pb.amplitude / pa.amplitude) : 0;
    if (Math.abs(change) > CHANGE_DB) out.push({ spectrum, order: (pa.order + pb.order) / 2, kind: change > 0 ? 'louder' : 'quieter', snrA: pa.snrDb, snrB: pb.snrDb, changeDb: change });
  }
  B.forEach((pb, j) => {
    if (!usedB.has(j)) out.push({ spectrum, order: pb.order, kind: 'appears', snrA: null, snrB: pb.snrDb, changeDb: null });
  });
  return out.sort((x, y) => x.order - y.order);
}
