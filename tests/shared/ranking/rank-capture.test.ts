import { describe, expect, it } from 'vitest';
import i4PetrolJson from '../../fixtures/drives/fixture-i4-petrol.json';
import v6PetrolJson from '../../fixtures/drives/fixture-v6-petrol.json';
import { rankCapture } from '../../../shared/ranking/rank-capture';
import { candidateLines } from '../../../shared/drive/candidate-lines';
import { parseDriveDocument } from '../../../shared/schemas/drive';
import type { ComponentCandidates, DriveDocument, Fault } from '../../../shared/drive/types';
import type { RankingEntry } from '../../../shared/analysis/types';
import { engineComb, plantedLines, synthInput, type SynthLine } from './synthetic-spectra';

// Ranking on spectra built directly (lines at chosen orders over a seeded noise floor), so each
// behaviour is checked on its own; tests/shared/ranking/rank-generated.test.ts runs the real pipeline.
const i4 = parseDriveDocument(i4PetrolJson);
const v6 = parseDriveDocument(v6PetrolJson);
const part = (drive: DriveDocument, name: string): ComponentCandidates => candidateLines(drive).find((c) => c.component === name)!;

function plant(drive: DriveDocument, name: string, fault: Fault, opts: { creep?: number; slip?: number; snrDb?: number; extraEnvelope?: SynthLine[]; extraOrders?: SynthLine[]; seed?: number } = {}) {
  const cc = part(drive, name);
  const partOrder = cc.ratio * (1 - (opts.creep ?? 0.01));
  const p = plantedLines(fault, partOrder, cc.factors!, cc.rotatingRing, opts.slip ?? 0.015, opts.snrDb ?? 20);
  const envelope = [...engineComb(64, drive.cylinders, 12), ...p.envelope, ...(opts.extraEnvelope ?? [])];
  return {
    input: synthInput([...engineComb(64, drive.cylinders, 26), ...p.orders, ...(opts.extraOrders ?? [])], [envelope, envelope.map((l) => ({ ...l, snrDb: l.snrDb - 5 }))], { seed: opts.seed ?? 3, cylinders: drive.cylinders }),
    lineOrder: p.lineOrder,
  };
}
const first = (ranking: RankingEntry[]) => ranking[0];

describe('rankCapture on synthetic spectra', () => {
  it('returns one entry per (part, fault) and per belt, sorted by score', () => {
    const ranking = rankCapture(i4, plant(i4, 'Alternator', 'outer_race').input);
    const parts = i4.components.filter((c) => c.kind !== 'crankshaft').length;
    expect(ranking).toHaveLength(parts * 5 + i4.belts.length);
    for (let i = 1; i < ranking.length; i += 1) {
      const [a, b] = [ranking[i - 1], ranking[i]];
      // Ties go to the reading nearer the middle of its likely range, then by name (rank-capture.ts).
      expect(a.score).toBeGreaterThanOrEqual(b.score);
    }
    for (const e of ranking) {
      expect(e.score).toBeGreaterThanOrEqual(0);
      expect(e.score).toBeLessThanOrEqual(1);
      expect(['component', 'belt']).toContain(e.target);
    }
    expect(ranking.find((e) => e.target === 'belt')?.slipPct).toBeNull();
  });

  it('puts an alternator outer-race pattern first with a technician\'s evidence sentence', () => {
    const { input, lineOrder } = plant(i4, 'Alternator', 'outer_race');
    const top = first(rankCapture(i4, input));
    expect([top.component, top.fault]).toEqual(['Alternator', 'outer_race']);
    expect(Math.abs(top.order - lineOrder)).toBeLessThan(0.02);
    expect(top.nominalOrder).toBeCloseTo(part(i4, 'Alternator').lines.find((l) => l.label === 'BPFO 1x')!.nominalOrder, 10);
    expect(top.evidence).toMatch(/^Alternator, outer race: 3 harmonics at [\d.]+, [\d.]+, [\d.]+ orders in the envelope, \d+ dB above floor/);
    expect(top.matched.length).toBeGreaterThanOrEqual(3);
  });

  it('tells an inner race with its ±1× sidebands from another part\'s coinciding outer race', () => {
    // Fixture I4: water pump BPFI (6.70) and upper idler BPFO (6.54) lie 2.4 % apart, inside each other's windows.
    const { input } = plant(i4, 'Water pump', 'inner_race', { creep: 0.02 });
    const ranking = rankCapture(i4, input);
    expect([ranking[0].component, ranking[0].fault]).toEqual(['Water pump', 'inner_race']);
    expect(ranking[0].evidence).toMatch(/sideband/);
  });

  it('finds the ball pattern at 2×BSF with its cage-speed sidebands', () => {
    const { input } = plant(v6, 'A/C compressor', 'ball', { creep: 0.03 });
    expect(first(rankCapture(v6, input))).toMatchObject({ component: 'A/C compressor', fault: 'ball' });
  });

  it('finds a shaft fault in the raw order spectrum and reports the slip from its shaft line', () => {
    const { input } = plant(i4, 'Alternator', 'shaft', { creep: 0.02 });
    const top = first(rankCapture(i4, input));
    expect(top).toMatchObject({ component: 'Alternator', fault: 'shaft' });
    expect(top.slipPct).not.toBeNull();
    expect(Math.abs(top.slipPct! - 2)).toBeLessThan(0.5);
  });

  it('finds a belt pattern at the belt-pass order and its harmonics', () => {
    const { input } = plant(v6, 'Front', 'belt', { creep: 0 });
    const cc = part(v6, 'Front');
    const p = plantedLines('belt', cc.ratio, { ftf: 0, bpfo: 0, bpfi: 0, bsf: 0 }, 'inner', 0, 20);
    const ranking = rankCapture(v6, synthInput([...engineComb(64, 6, 26), ...p.orders], [engineComb(64, 6, 12)], { seed: 5, cylinders: 6 }));
    expect(first(ranking)).toMatchObject({ component: 'Front', target: 'belt', fault: 'belt' });
    expect(input).toBeDefined();
  });

  it('gives little weight to a pattern made only of engine orders', () => {
    // Only the engine's own 0.5-order comb, strongly, in both spectra: nothing should look like a fault.
    const input = synthInput(engineComb(64, 4, 30), [engineComb(64, 4, 24)], { seed: 9 });
    const top = first(rankCapture(i4, input));
    expect(top.score).toBeLessThan(0.45);
    expect(top.evidence).toMatch(/on an engine order|on engine orders/);
  });

  it('judges engine-synchronous lines from the whole pattern', () => {
    // The alternator's BPFO (8.245 nominal) with −2.8 % slip puts its 1× on the engine order 8.0,
    // but its 2× and 3× stand off the comb: the pattern is still the alternator's outer race.
    const bpfo = part(i4, 'Alternator').lines.find((l) => l.label === 'BPFO 1x')!.nominalOrder;
    const g = 8.018;
    expect(g / bpfo - 1).toBeCloseTo(-0.028, 3);
    // Engine residue at every other 0.5-order multiple (the 720° average never removes it all).
    const residue = engineComb(40, 4, 9).filter((l) => ![8, 16, 24].includes(l.order)).map((l) => ({ ...l, snrDb: 9 }));
    const pattern = [{ order: g, snrDb: 20 }, { order: 2 * g, snrDb: 18 }, { order: 3 * g, snrDb: 16 }];
    const ranking = rankCapture(i4, synthInput(engineComb(64, 4, 26), [[...residue, ...pattern]], { seed: 4 }));
    const alt = ranking.find((e) => e.component === 'Alternator' && e.fault === 'outer_race')!;
    expect(ranking[0]).toBe(alt);
    expect(alt.evidence).toMatch(/1 of 3 lines sit on engine orders/);
    // The same three lines all on the comb (8.0, 16.0, 24.0) count much less there.
    const onCombLines = [8, 16, 24].map((order, i) => ({ order, snrDb: 20 - 2 * i }));
    const onComb = rankCapture(i4, synthInput(engineComb(64, 4, 26), [[...residue, ...onCombLines]], { seed: 4 }));
    expect(onComb.find((e) => e.component === 'Alternator' && e.fault === 'outer_race')!.score).toBeLessThan(0.7 * alt.score);
    // Where the residual envelope shows no engine comb at all, lines on 0.5-order multiples are not suspect.
    const clean = rankCapture(i4, synthInput(engineComb(64, 4, 26), [onCombLines], { seed: 4 }));
    expect(clean.find((e) => e.component === 'Alternator' && e.fault === 'outer_race')!.score).toBeGreaterThan(0.9 * alt.score);
  });

  it('marks entries of a bearing known only by rule of thumb as approximate', () => {
    const drive: DriveDocument = { ...i4, components: [...i4.components, { name: 'Fan idler', kind: 'idler', belt: 'Main', pulleyMm: 90 }] };
    const ranking = rankCapture(drive, plant(i4, 'Alternator', 'outer_race').input);
    const fan = ranking.filter((e) => e.component === 'Fan idler');
    expect(fan.filter((e) => e.fault !== 'shaft').every((e) => e.approximate)).toBe(true);
    expect(ranking.filter((e) => e.component === 'Alternator').every((e) => !e.approximate)).toBe(true);
  });

  it('names truly indistinguishable parts (same ratio, same bearing) in each other\'s entries', () => {
    const { input } = plant(v6, 'Idler A', 'outer_race');
    const ranking = rankCapture(v6, input);
    const topTwo = ranking.slice(0, 2);
    expect(topTwo.map((e) => e.component).sort()).toEqual(['Idler A', 'Idler B']);
    expect(topTwo.every((e) => e.fault === 'outer_race')).toBe(true);
    expect(topTwo[0].indistinguishableFrom).toEqual([topTwo[1].component]);
    expect(topTwo[1].indistinguishableFrom).toEqual([topTwo[0].component]);
    expect(topTwo[0].evidence).toMatch(/probe nearer each part/);
    // Parts with merely overlapping windows are not named.
    expect(ranking.find((e) => e.component === 'Alternator' && e.fault === 'outer_race')?.indistinguishableFrom).toEqual([]);
  });

  it('does not pin a stray impulsive source outside every window on a part', () => {
    // One part only, so that clear orders exist (a full drive's windows cover most of the range).
    const drive: DriveDocument = { ...i4, components: i4.components.filter((c) => ['Crankshaft', 'Alternator'].includes(c.name)) };
    const windows = candidateLines(drive).flatMap((c) => c.lines.map((l) => l.window));
    const clear = (o: number) => windows.every(([lo, hi]) => o < lo - 0.1 || o > hi + 0.1) && Math.abs(2 * o - Math.round(2 * o)) > 0.2;
    let stray = 3;
    while (![1, 2, 3].every((k) => clear(k * stray))) stray += 0.01;
    expect(stray).toBeLessThan(20);
    const input = synthInput(engineComb(64, 4, 26), [[...engineComb(64, 4, 12), ...[1, 2, 3].map((k) => ({ order: k * stray, snrDb: 22 }))]], { seed: 6 });
    expect(first(rankCapture(drive, input)).score).toBeLessThan(0.35);
  });

  it('refuses an input without a usable order spectrum', () => {
    const input = plant(i4, 'Alternator', 'outer_race').input;
    expect(() => rankCapture(i4, { ...input, orders: { ...input.orders, resolution: 0 } })).toThrow(RangeError);
  });
});
