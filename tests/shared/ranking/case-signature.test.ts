import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runPipeline } from '../../../shared/analysis/pipeline';
import { resolveSettings } from '../../../shared/analysis/resolve-settings';
import type { RankingInput } from '../../../shared/analysis/types';
import type { DriveDocument } from '../../../shared/drive/types';
import { caseSignature, type PastCase, SIGNATURE_SLOTS, signatureDistance, similarCases } from '../../../shared/ranking/case-signature';
import { generateCapture } from '../../../shared/synth/generate-capture';
import type { GenerateOptionsInput } from '../../../shared/synth/options';

// Issue 20 item 4: case memory on a seeded demo history. Confirmed past cases of one engine
// (generated captures, each fault planted in a different part or as a different fault of the same
// part), one of another engine; a new case of a known fault made with a different seed, rpm,
// noise and probe contact (engine level) must find its twin first among the same-engine
// distractors. The normalised distance is ‖a − b‖ / (‖a‖ + ‖b‖) (a common normalisation; 0 = same).
const load = (n: string): DriveDocument => JSON.parse(readFileSync(new URL(`../../fixtures/drives/${n}`, import.meta.url), 'utf8'));
const i4 = load('fixture-i4-petrol.json');
const v6 = load('fixture-v6-petrol.json');

function analyse(drive: DriveDocument, o: Omit<GenerateOptionsInput, 'drive'>): RankingInput {
  const g = generateCapture({ drive, durationS: 5, sampleRateHz: 24_000, wanderPct: 2, ...o });
  const r = runPipeline(g, resolveSettings({ cylinders: drive.cylinders, firingOrder: drive.firingOrder }));
  return { orders: r.orders.spectrum, envelopes: r.envelope.bands, cylinders: drive.cylinders, cyclesAveraged: r.cycle.cyclesAveraged, meanRpm: r.speed.meanRpm };
}

const HISTORY: { id: string; engine: 'i4' | 'v6'; part: string; kind: string; fault: 'outer_race' | 'inner_race' | 'shaft' | 'cage' | 'ball' | 'belt'; seed: number; rpm: number }[] = [
  { id: 'twin', engine: 'i4', part: 'Alternator', kind: 'alternator', fault: 'outer_race', seed: 301, rpm: 780 },
  { id: 'alt-shaft', engine: 'i4', part: 'Alternator', kind: 'alternator', fault: 'shaft', seed: 302, rpm: 800 },
  { id: 'alt-inner', engine: 'i4', part: 'Alternator', kind: 'alternator', fault: 'inner_race', seed: 303, rpm: 760 },
  { id: 'pump-inner', engine: 'i4', part: 'Water pump', kind: 'water_pump', fault: 'inner_race', seed: 304, rpm: 820 },
  { id: 'idler-outer', engine: 'i4', part: 'Upper idler', kind: 'idler', fault: 'outer_race', seed: 305, rpm: 790 },
  { id: 'tensioner-cage', engine: 'i4', part: 'Tensioner', kind: 'tensioner', fault: 'cage', seed: 306, rpm: 780 },
  { id: 'belt', engine: 'i4', part: 'Main', kind: 'belt', fault: 'belt', seed: 307, rpm: 780 },
  { id: 'v6-alt-outer', engine: 'v6', part: 'Alternator', kind: 'alternator', fault: 'outer_race', seed: 308, rpm: 700 },
];

describe('case memory: signatures and similar cases', { timeout: 60_000 }, () => {
  const history: PastCase[] = HISTORY.map((h) => {
    const drive = h.engine === 'i4' ? i4 : v6;
    const input = analyse(drive, { seed: h.seed, rpm: h.rpm, snrDb: 0, fault: { component: h.part, fault: h.fault } });
    return { caseId: h.id, engineId: h.engine, part: h.part, partKind: h.kind, fault: h.fault, cause: `${h.part} ${h.fault}`, signature: caseSignature(drive, h.part, [input]) };
  });
  // The new case: same fault as "twin", another seed, a higher idle, more noise, a weaker contact.
  const fresh = [analyse(i4, { seed: 911, rpm: 900, snrDb: -3, engineLevel: 0.5, fault: { component: 'Alternator', fault: 'outer_race' } })];

  it('a signature has one value per slot, the planted fault\'s lines strongest', () => {
    const twin = history[0].signature;
    expect(twin.length).toBe(SIGNATURE_SLOTS.length);
    const bpfo = SIGNATURE_SLOTS.indexOf('BPFO 1x');
    const ftf = SIGNATURE_SLOTS.indexOf('FTF 1x');
    expect(twin[bpfo]).toBeGreaterThan(twin[ftf]);
  });

  it('finds the twin first among same-engine cases of other faults', () => {
    const found = similarCases({ engineId: 'i4', drive: i4, captures: fresh }, history);
    expect(found.length).toBeGreaterThan(0);
    expect(found[0].caseId).toBe('twin');
    expect(found.length).toBeLessThanOrEqual(3);
    const dTwin = found[0].distance;
    for (const other of ['alt-shaft', 'pump-inner', 'idler-outer', 'belt']) {
      const sig = caseSignature(i4, history.find((h) => h.caseId === other)!.part, fresh);
      expect(signatureDistance(sig, history.find((h) => h.caseId === other)!.signature), other).toBeGreaterThan(dTwin);
    }
  });

  it('lists same-engine cases before another engine\'s, even a close one', () => {
    const found = similarCases({ engineId: 'i4', drive: i4, captures: fresh }, history, 10);
    const firstOther = found.findIndex((f) => !f.sameEngine);
    if (firstOther >= 0) expect(found.slice(firstOther).every((f) => !f.sameEngine)).toBe(true);
    expect(found.some((f) => f.caseId === 'v6-alt-outer')).toBe(true);
  });

  it('distance: 0 for the same pattern whatever its scale, √2/2 for two lone lines in different slots, 1 when both are empty', () => {
    expect(signatureDistance([1, 2, 0], [2, 4, 0])).toBeCloseTo(1 / 3, 12);
    expect(signatureDistance([1, 0], [0, 1])).toBeCloseTo(Math.SQRT2 / 2, 12);
    expect(signatureDistance([3, 1], [3, 1])).toBe(0);
    expect(signatureDistance([0, 0], [0, 0])).toBe(1);
    expect(() => signatureDistance([1], [1, 2])).toThrow(/same length/);
  });

  it('refuses a part the drive lacks', () => {
    expect(() => caseSignature(i4, 'Supercharger', fresh)).toThrow(/no part or belt named "Supercharger"/);
  });
});
