/**
 * Judges a capture's ranking against what was planted in it (our targets, as scripts/accuracy.ts reports them): the planted
 * part first (counting distinct components, a belt as one), the planted part and fault first,
 * the planted part among the first three; and, where the planted part has truly
 * indistinguishable partners (same ratio and bearing), both in the top two naming each other.
 * Used by the ranking tests and `npm run accuracy`.
 */
import type { RankingEntry } from '../analysis/types';

/** What was planted, and which parts share its whole line pattern. */
export interface PlantedTruth {
  component: string;
  fault: RankingEntry['fault'];
  indistinguishableFrom?: readonly string[];
}

/** The verdict on one ranking. */
export interface RankingVerdict {
  /** 1-based place of the planted part among distinct components (0 = absent). */
  partPlace: number;
  topPart: boolean;
  topPartAndFault: boolean;
  topThreePart: boolean;
  /** Null without indistinguishable partners; else both in the top two naming each other. */
  pairNamed: boolean | null;
  /** The first entry, for reports. */
  first: { component: string; fault: string; score: number } | null;
}

const same = (a: string, b: string): boolean => a.trim().toLowerCase() === b.trim().toLowerCase();

/** Judges one ranking. A partner of a truly indistinguishable pair counts as the planted part. */
export function judgeRanking(ranking: readonly RankingEntry[], truth: PlantedTruth): RankingVerdict {
  const partners = truth.indistinguishableFrom ?? [];
  const isPlanted = (name: string) => same(name, truth.component) || partners.some((p) => same(p, name));
  const distinct: string[] = [];
  for (const e of ranking) if (!distinct.some((d) => same(d, e.component))) distinct.push(e.component);
  const exactPlace = distinct.findIndex((d) => same(d, truth.component)) + 1;
  const first = ranking[0];
  let pairNamed: boolean | null = null;
  if (partners.length > 0) {
    const topTwo = distinct.slice(0, 2);
    const group = [truth.component, ...partners];
    const entryOf = (name: string) => ranking.find((e) => same(e.component, name) && e.fault === truth.fault);
    pairNamed = group.every((name) => topTwo.some((t) => same(t, name)))
      && group.every((name) => group.filter((other) => !same(other, name)).every((other) => (entryOf(name)?.indistinguishableFrom ?? []).some((n) => same(n, other))));
  }
  return {
    partPlace: exactPlace,
    topPart: distinct.length > 0 && isPlanted(distinct[0]),
    topPartAndFault: !!first && isPlanted(first.component) && first.fault === truth.fault,
    topThreePart: exactPlace >= 1 && exactPlace <= 3,
    pairNamed,
    first: first ? { component: first.component, fault: first.fault, score: first.score } : null,
  };
}
