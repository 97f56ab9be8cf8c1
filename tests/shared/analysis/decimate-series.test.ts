// Plot decimation (shared/analysis/decimate-series.ts): min/max buckets keep every extreme however
// far a series is reduced (the envelope decimation common in plotting practice), and max pooling of
// a grid keeps each block's largest cell.
import { describe, expect, it } from 'vitest';
import { maxPoolGrid, minMaxIndices } from '../../../shared/analysis/decimate-series';
import { gaussian } from '../../helpers/signals';

describe('minMaxIndices', () => {
  it('keeps at most the asked number of points, in order, and the global max and min', () => {
    const y = gaussian(100_003, 5);
    y[77_777] = 50;
    y[12_345] = -40;
    for (const points of [2, 10, 333, 4000]) {
      const idx = minMaxIndices(y, points);
      expect(idx.length).toBeLessThanOrEqual(points);
      expect(idx.every((v, i) => i === 0 || v > idx[i - 1])).toBe(true);
      expect(idx).toContain(77_777);
      expect(idx).toContain(12_345);
    }
  });

  it('returns every index of a short series and honours a sub-range', () => {
    expect(minMaxIndices([3, 1, 2], 10)).toEqual([0, 1, 2]);
    const idx = minMaxIndices(gaussian(1000, 2), 20, 100, 200);
    expect(Math.min(...idx)).toBeGreaterThanOrEqual(100);
    expect(Math.max(...idx)).toBeLessThan(200);
    expect(() => minMaxIndices([1, 2, 3], 1)).toThrow(RangeError);
  });
});

describe('maxPoolGrid', () => {
  it('pools to at most the asked cells and keeps the largest cell of each block', () => {
    const frames = 101;
    const bins = 257;
    const v = new Float32Array(frames * bins);
    v[50 * bins + 200] = 9;
    const g = maxPoolGrid(v, frames, bins, 1000);
    expect(g.frames * g.bins).toBeLessThanOrEqual(1000);
    expect(g.values.length).toBe(g.frames * g.bins);
    const at = Math.floor(50 / g.frameStep) * g.bins + Math.floor(200 / g.binStep);
    expect(g.values[at]).toBe(9);
    expect(Math.max(...g.values)).toBe(9);
  });
});
