// `analyze` without --json speaks to a technician (issue 17 item 13): plain words, amplitudes with
// units, short evidence, and a warning when the strongest line fits no part of the engine file.
import { describe, expect, it } from 'vitest';
import type { AnalysisResult } from '../../../shared/analysis/types';
import { AnalysisSettingsSchema } from '../../../shared/schemas/analysis-settings';
import { formatSummary, plainOptionError, shortEvidence } from '../../../server/cli/format-summary';

const peak = (order: number, amplitude: number, snrDb: number, engineOrder: number | null = null) => ({ order, amplitude, snrDb, engineOrder, firing: engineOrder !== null && engineOrder % 2 === 0 });

function result(): AnalysisResult {
  return {
    capture: { sampleRateHz: 48000, durationS: 10, channels: 2, format: 'csv', channelUnits: [null, 'g'] },
    settings: AnalysisSettingsSchema.parse({}),
    speed: { meanRpm: 779.4, minRpm: 764, maxRpm: 794, stabilityPct: 1, edges: 65, repairedEdges: 1, gaps: 0 },
    orders: { spectrum: { resolution: 0.03125, maxOrder: 100 }, peaks: [peak(2, 0.36, 53, 2), peak(6.31, 0.05, 30)] },
    envelope: { bandHz: [3400, 4450], bandChoice: 'auto', resolution: 0.03125, peaks: [peak(8.74, 0.0277, 29)], bands: [], residual: true },
    cycle: { cyclesAveraged: 64, event: null },
    ranking: [{
      component: 'Alternator', target: 'component', fault: 'outer_race', order: 8.74, nominalOrder: 8.7, score: 0.77, slipPct: null,
      evidence: 'Alternator, outer race: 3 harmonics in the envelope; also in 1 other band; close to 3× its own shaft speed', indistinguishableFrom: [], approximate: false, matched: [],
    }],
    warnings: [],
  } as unknown as AnalysisResult;
}

describe('analyze text summary', () => {
  it('uses plain words and amplitudes with the pickup unit, never snake_case fault names', () => {
    const text = formatSummary(result(), 'idle.csv');
    expect(text).toContain('Alternator: bearing outer race, at order 8.74');
    expect(text).not.toMatch(/outer_race|inner_race/);
    expect(text).toContain('order 6.31, 0.0500 g, 30 dB above the floor');
    expect(text).toContain('order 2.00, 0.360 g, 53 dB above the floor (firing order: the engine itself)');
    expect(text).toContain('Engine speed: 779 rpm on average');
  });

  it('says when the strongest line fits no part of the engine file', () => {
    const fitsOnly874 = (order: number) => Math.abs(order - 8.74) < 0.1;
    const text = formatSummary(result(), 'idle.csv', fitsOnly874);
    expect(text).toContain('the strongest line, order 6.31 at 30 dB, fits no part of this engine: check the engine file or the pulley sizes');
    expect(formatSummary(result(), 'idle.csv', () => true)).not.toContain('fits no part');
  });

  it('shortens evidence to two clauses and says option errors in plain words', () => {
    expect(shortEvidence('a; b; c')).toBe('A; b …');
    expect(shortEvidence('one line')).toBe('One line.');
    expect(plainOptionError('--cylinders', { code: 'too_small', minimum: 1, message: 'Too small' })).toBe('--cylinders must be a whole number of at least 1');
    expect(plainOptionError('--max-rpm', { code: 'too_big', maximum: 30000, message: 'Too big' })).toBe('--max-rpm must be a number of at most 30000');
  });
});
