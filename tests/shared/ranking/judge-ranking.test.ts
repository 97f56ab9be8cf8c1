import { describe, expect, it } from 'vitest';
import { judgeRanking } from '../../../shared/ranking/judge-ranking';
import type { RankingEntry } from '../../../shared/analysis/types';

const entry = (component: string, fault: RankingEntry['fault'], score: number, indistinguishableFrom: string[] = []): RankingEntry => ({
  component, target: 'component', fault, order: 1, nominalOrder: 1, score, slipPct: null, evidence: '', indistinguishableFrom, approximate: false, matched: [],
});

describe('judgeRanking', () => {
  it('counts distinct components for places', () => {
    const ranking = [entry('Idler', 'ball', 0.9), entry('Idler', 'outer_race', 0.8), entry('Pump', 'shaft', 0.7), entry('Alternator', 'outer_race', 0.6)];
    const v = judgeRanking(ranking, { component: 'Alternator', fault: 'outer_race' });
    expect(v.partPlace).toBe(3);
    expect(v.topThreePart).toBe(true);
    expect(v.topPart).toBe(false);
  });

  it('needs the fault as well for part-and-fault first', () => {
    const ranking = [entry('Alternator', 'inner_race', 0.9), entry('Alternator', 'outer_race', 0.8)];
    const v = judgeRanking(ranking, { component: 'alternator', fault: 'outer_race' });
    expect(v.topPart).toBe(true);
    expect(v.topPartAndFault).toBe(false);
  });

  it('requires indistinguishable partners in the top two naming each other', () => {
    const good = [entry('Idler A', 'outer_race', 0.9, ['Idler B']), entry('Idler B', 'outer_race', 0.9, ['Idler A'])];
    expect(judgeRanking(good, { component: 'Idler B', fault: 'outer_race', indistinguishableFrom: ['Idler A'] })).toMatchObject({ pairNamed: true, topPart: true, topPartAndFault: true });
    const unnamed = [entry('Idler A', 'outer_race', 0.9), entry('Idler B', 'outer_race', 0.9)];
    expect(judgeRanking(unnamed, { component: 'Idler A', fault: 'outer_race', indistinguishableFrom: ['Idler B'] }).pairNamed).toBe(false);
    expect(judgeRanking(good, { component: 'Idler A', fault: 'outer_race' }).pairNamed).toBeNull();
  });
});
