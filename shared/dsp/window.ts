/**
 * Analysis windows, periodic (DFT-even) as in Harris 1978 §II: w[n] for n = 0..N−1 with period N,
 * so the window's DFT is exact on bin centres. Coherent gain CG = Σw/N; equivalent noise bandwidth
 * ENBW = N·Σw²/(Σw)² in bins (F. J. Harris, Proc. IEEE 66(1):51–83, 1978). A tone of amplitude A
 * on a bin centre gives a one-sided |X| = (A/2)·N·CG, so amplitude = 2|X| / (N·CG).
 */

export type WindowKind = 'rectangular' | 'hann' | 'flattop';

/** Flat-top coefficients (docs/references.md §2: 0.21557895, 0.41663158, 0.277263158, 0.083578947, 0.006947368). */
const FLATTOP = [0.21557895, 0.41663158, 0.277263158, 0.083578947, 0.006947368];

/** A periodic window of length n. */
export function createWindow(kind: WindowKind, n: number): Float64Array {
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`window length must be a positive integer, got ${n}`);
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = (2 * Math.PI * i) / n;
    switch (kind) {
      case 'rectangular': w[i] = 1; break;
      case 'hann': w[i] = 0.5 - 0.5 * Math.cos(x); break;
      case 'flattop':
        w[i] = FLATTOP[0] - FLATTOP[1] * Math.cos(x) + FLATTOP[2] * Math.cos(2 * x) - FLATTOP[3] * Math.cos(3 * x) + FLATTOP[4] * Math.cos(4 * x);
        break;
    }
  }
  return w;
}

/** Coherent gain Σw/N (Harris 1978). */
export function coherentGain(w: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < w.length; i++) s += w[i];
  return s / w.length;
}

/** Equivalent noise bandwidth in bins, N·Σw²/(Σw)² (Harris 1978). */
export function enbwBins(w: ArrayLike<number>): number {
  let s = 0;
  let s2 = 0;
  for (let i = 0; i < w.length; i++) { s += w[i]; s2 += w[i] * w[i]; }
  return (w.length * s2) / (s * s);
}
