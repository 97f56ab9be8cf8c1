/**
 * Builds RankingInput spectra directly, for testing the ranking without the pipeline: a seeded
 * noise floor (power-averaged, so its amplitude scatters a few dB about the median) plus lines at
 * chosen orders drawn with the Hann window's main-lobe shape, and a running-median-like floor.
 */
import type { EnvelopeBand, OrderSpectrum, RankingInput } from '../../../shared/analysis/types';

/** A line to draw: order and SNR over the floor in dB. */
export interface SynthLine { order: number; snrDb: number }

/** Small seeded PRNG (mulberry32). */
export function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function hannLobe(deltaBins: number): number {
  const d = Math.abs(deltaBins);
  if (d < 1e-9) return 1;
  if (Math.abs(d - 1) < 1e-9) return 0.5;
  const sinc = Math.sin(Math.PI * d) / (Math.PI * d);
  return Math.abs(sinc / (1 - d * d));
}

/** An order spectrum with noise (about 1.0 floor) and the given lines. `averages` sets the noise scatter. */
export function synthSpectrum(lines: SynthLine[], opts: { resolution?: number; maxOrder?: number; seed?: number; averages?: number } = {}): OrderSpectrum {
  const resolution = opts.resolution ?? 1 / 32;
  const maxOrder = opts.maxOrder ?? 64;
  const n = Math.round(maxOrder / resolution) + 1;
  const rand = prng(opts.seed ?? 1);
  const averages = opts.averages ?? 8;
  const power = new Float64Array(n);
  for (let k = 0; k < n; k += 1) {
    let p = 0;
    for (let j = 0; j < averages; j += 1) {
      const u = Math.max(rand(), 1e-12);
      p += -Math.log(u); // exponential power of complex Gaussian noise
    }
    power[k] = p / averages;
  }
  for (const line of lines) {
    const amp = 10 ** (line.snrDb / 20);
    const centre = line.order / resolution;
    for (let k = Math.max(0, Math.floor(centre) - 3); k <= Math.min(n - 1, Math.ceil(centre) + 3); k += 1) {
      const a = amp * hannLobe(k - centre);
      power[k] += a * a;
    }
  }
  const amplitude = new Float64Array(n);
  for (let k = 0; k < n; k += 1) amplitude[k] = Math.sqrt(power[k]);
  const floor = new Float64Array(n).fill(1);
  return { resolution, maxOrder, samplesPerRev: 2 * maxOrder, revsPerBlock: Math.round(1 / resolution), blocks: averages, amplitude, floor };
}

/** Engine lines at every 0.5-order multiple up to `upTo`, strong at firing orders. */
export function engineComb(upTo: number, cylinders = 4, snrDb = 20): SynthLine[] {
  const out: SynthLine[] = [];
  for (let o = 0.5; o <= upTo; o += 0.5) out.push({ order: o, snrDb: o % (cylinders / 2) === 0 ? snrDb + 6 : snrDb - 4 });
  return out;
}

/** A RankingInput from an order spectrum's lines and one or more envelope bands' lines. */
export function synthInput(orderLines: SynthLine[], envelopeLines: SynthLine[][], opts: { seed?: number; resolution?: number; maxOrder?: number; cylinders?: number; cyclesAveraged?: number } = {}): RankingInput {
  const seed = opts.seed ?? 1;
  const orders = synthSpectrum(orderLines, { ...opts, seed });
  const envelopes: EnvelopeBand[] = envelopeLines.map((lines, i) => ({
    bandHz: [2000 + 1000 * i, 3000 + 1000 * i], score: 3 - i, peaks: [], spectrum: synthSpectrum(lines, { ...opts, seed: seed * 7919 + i + 1 }),
  }));
  return { orders, envelopes, cylinders: opts.cylinders ?? 4, cyclesAveraged: opts.cyclesAveraged ?? 60, meanRpm: 780 };
}
