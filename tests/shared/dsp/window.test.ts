import { describe, expect, it } from 'vitest';
import { coherentGain, createWindow, enbwBins } from '../../../shared/dsp/window';

// Source: F. J. Harris, "On the use of windows for harmonic analysis with the discrete Fourier
// transform", Proc. IEEE 66(1):51–83, 1978 — values as recomputed with scipy in docs/references.md §2
// [derived], periodic windows, N ≥ 2048.
const HARRIS = [
  { kind: 'rectangular', cg: 1.0, enbw: 1.0 },
  { kind: 'hann', cg: 0.5, enbw: 1.5 },
  { kind: 'flattop', cg: 0.2156, enbw: 3.7702 },
] as const;

describe('windows (Harris 1978 table, REFERENCES.md §2)', () => {
  for (const { kind, cg, enbw } of HARRIS) {
    it(`${kind}: coherent gain ${cg} and ENBW ${enbw} bins`, () => {
      const w = createWindow(kind, 4096);
      expect(coherentGain(w)).toBeCloseTo(cg, 4);
      expect(enbwBins(w)).toBeCloseTo(enbw, 4);
    });
  }

  it('is periodic (DFT-even): the Hann window starts at 0 and peaks at N/2', () => {
    const w = createWindow('hann', 8);
    expect(w[0]).toBe(0);
    expect(w[4]).toBeCloseTo(1, 12);
    expect(w[1]).toBeCloseTo(w[7], 12);
  });

  it('refuses a zero length', () => {
    expect(() => createWindow('hann', 0)).toThrow(RangeError);
  });
});
