import { describe, expect, it } from 'vitest';
import { generateCapture } from '../../../shared/synth/generate-capture';
import { drives } from '../../helpers/scenarios';
import { risingEdges } from './signal-checks';

// Four-stroke facts (docs/references.md §5, common practice; Heywood 1988, from memory): one engine
// cycle is 720° of crank, so a cylinder-1 pulse comes once per two revolutions; a wasted spark
// once per revolution; one pulse per cylinder gives `cylinders` pulses per cycle. Trigger wheels
// 60-2 and 36-1 (common practice): 58 and 35 teeth, the gap counted as missing pitches.

const drive = drives.i4Petrol;
const steady = { wanderPct: 0, firingFluctuationPct: 0, sampleRateHz: 20000 } as const;

describe('reference channel', () => {
  it('gives 65 cylinder-1 pulses in 10 s at 780 rpm (6.5 cycles per second)', () => {
    const { channels, truth, sampleRateHz } = generateCapture({ drive, seed: 4, durationS: 10, rpm: 780, refKind: 'cyl1', ...steady });
    const edges = risingEdges(channels[0], sampleRateHz, 1.0, 0.2, 0.005);
    expect(edges).toHaveLength(65);
    expect(truth.reference.edges).toBe(65);
    // Pulses are 720° apart: 60 / 780 × 2 s.
    const gaps = edges.slice(1).map((t, i) => t - edges[i]);
    for (const g of gaps) expect(g).toBeCloseTo(120 / 780, 4);
  });

  it.each([
    ['per-rev', {}, 2],
    ['per-cylinder', {}, 4],
    ['cyl1', { refPerCycle: 3 }, 3],
  ] as const)('draws %s references with the right pulse count per 720° (%o)', (refKind, extra, perCycle) => {
    const { channels, truth, sampleRateHz } = generateCapture({ drive, seed: 5, durationS: 3, rpm: 900, refKind, ...extra, ...steady });
    // The weak wasted spark peaks at half the main pulse (2 V): a 0.5 V threshold catches both.
    const edges = risingEdges(channels[0], sampleRateHz, 0.5, 0.1, 0.004);
    const cycles = (3 * 900) / 120;
    expect(Math.abs(edges.length - cycles * perCycle)).toBeLessThanOrEqual(1);
    expect(truth.reference.edges).toBe(edges.length);
  });

  it('makes the exhaust-stroke wasted spark weaker by the given ratio', () => {
    const { channels, sampleRateHz } = generateCapture({ drive, seed: 6, durationS: 2, rpm: 800, refKind: 'per-rev', wastedSparkRatio: 0.4, ...steady });
    const edges = risingEdges(channels[0], sampleRateHz, 0.3, 0.1, 0.004);
    const peaks = edges.map((t) => {
      const i0 = Math.floor(t * sampleRateHz);
      let peak = 0;
      for (let i = i0; i < i0 + 10; i++) peak = Math.max(peak, channels[0][i]);
      return peak;
    });
    const even = peaks.filter((_, i) => i % 2 === 0);
    const odd = peaks.filter((_, i) => i % 2 === 1);
    const mean = (a: number[]) => a.reduce((s, v) => s + v, 0) / a.length;
    const ratio = Math.min(mean(even), mean(odd)) / Math.max(mean(even), mean(odd));
    expect(ratio).toBeGreaterThan(0.33);
    expect(ratio).toBeLessThan(0.47);
  });

  it('inverts the pulses for falling polarity', () => {
    const { channels, sampleRateHz } = generateCapture({ drive, seed: 7, durationS: 2, rpm: 780, refKind: 'cyl1', refPolarity: 'falling', ...steady });
    const negated = Float32Array.from(channels[0], (v) => -v);
    const edges = risingEdges(negated, sampleRateHz, 1.0, 0.2, 0.005);
    expect(edges.length).toBeGreaterThanOrEqual(12);
    // Each pulse's first swing (its edge) goes negative, to about −2 V; the ring that follows is smaller.
    for (const t of edges) {
      const i0 = Math.floor(t * sampleRateHz);
      const first = channels[0].subarray(i0, i0 + 3);
      expect(Math.min(...first)).toBeLessThan(-1.5);
    }
    expect(Math.max(...channels[0])).toBeLessThan(0.85 * -Math.min(...channels[0]));
  });

  it.each([
    ['60-2', 'vr', 58],
    ['36-1', 'hall', 35],
  ] as const)('draws a %s wheel (%s sensor) with %i teeth per revolution and its gap', (wheel, wheelSensor, teeth) => {
    const { channels, truth, sampleRateHz } = generateCapture({ drive, seed: 8, durationS: 2, rpm: 780, refKind: 'wheel', wheel, wheelSensor, ...steady, sampleRateHz: 48000 });
    const [hi, lo] = wheelSensor === 'vr' ? [0.35, -0.35] : [2.5, 1.0];
    const edges = risingEdges(channels[0], sampleRateHz, hi, lo);
    expect(edges.length).toBe(truth.reference.edges);
    const intervals = edges.slice(1).map((t, i) => t - edges[i]);
    const median = [...intervals].sort((a, b) => a - b)[Math.floor(intervals.length / 2)];
    const gapAt = intervals.map((d, i) => (d > 1.5 * median ? i : -1)).filter((i) => i >= 0);
    expect(gapAt.length).toBe(truth.reference.gaps);
    // Between two gaps, teeth − 1 tooth intervals; the gap spans (missing + 1) pitches.
    for (let g = 1; g < gapAt.length; g++) expect(gapAt[g] - gapAt[g - 1]).toBe(teeth);
    const pitches = Number(wheel.split('-')[0]);
    expect(intervals[gapAt[0]] / median).toBeCloseTo(pitches - teeth + 1, 1);
  });

  it('puts cylinder-1 TDC tdcOffsetDeg after the reference edge', () => {
    // One tick at 100° after TDC and nothing else on the pickup: it must ring 100° + offset after the edge.
    const offset = 25;
    const { channels, sampleRateHz } = generateCapture({
      drive, seed: 9, durationS: 2, rpm: 750, refKind: 'cyl1', tdcOffsetDeg: offset, engineLevel: 0, snrDb: 80,
      injectorTicks: [{ cylinder: 1, angleDeg: 100, amplitude: 1 }], ...steady,
    });
    const refEdges = risingEdges(channels[0], sampleRateHz, 1.0, 0.2, 0.005);
    const degPerS = (750 / 60) * 360;
    const pickup = channels[1];
    for (const edge of refEdges.slice(0, 4)) {
      const start = Math.ceil(edge * sampleRateHz);
      let onset = -1;
      for (let i = start; i < pickup.length && onset < 0; i++) if (Math.abs(pickup[i]) > 0.05) onset = i;
      const lagDeg = (onset / sampleRateHz - edge) * degPerS;
      expect(lagDeg).toBeGreaterThan(100 + offset - 1);
      expect(lagDeg).toBeLessThan(100 + offset + 2);
    }
  });

  it('raises the cam edge camLeadDeg before cylinder-1\'s reference edge', () => {
    const { channels, truth, sampleRateHz } = generateCapture({ drive, seed: 10, durationS: 2, rpm: 780, refKind: 'per-rev', camChannel: true, camLeadDeg: 30, tdcOffsetDeg: 10, ...steady });
    expect(channels).toHaveLength(3);
    expect(truth.analysis.camChannel).toBe(3);
    const cam = risingEdges(channels[2], sampleRateHz, 2.5, 1.0);
    const ref = risingEdges(channels[0], sampleRateHz, 0.5, 0.1, 0.004);
    const degPerS = (780 / 60) * 360;
    for (const c of cam) {
      const next = ref.find((t) => t > c);
      if (next === undefined) continue;
      expect((next - c) * degPerS).toBeCloseTo(30, 0);
    }
    expect(truth.reference.camEdgeAngleDeg).toBeCloseTo(720 - 10 - 30, 6);
  });
});
