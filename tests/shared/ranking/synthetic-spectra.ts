/**
 * Builds RankingInput spectra directly, for testing the ranking without the pipeline: a seeded
 * noise floor (power-averaged, so its amplitude scatters a few dB about the median) plus lines at
 * chosen orders drawn with the Hann window's main-lobe shape, and a running-median-like floor.
 */
import type { EnvelopeBand, OrderSpectrum, RankingInput } from '../../../shared/analysis/types';
import { createRng } from '../../../shared/synth/prng';

/** A line to draw: order and SNR over the floor in dB. */
export interface SynthLine { order: number; snrDb: number }

/** Seeded uniforms in [0, 1): the generator's mulberry32 (shared/synth/prng.ts), so there is one PRNG. */
export function prng(seed: number): () => number {
  const source = createRng(seed);
  return () => source.uniform();
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

/** Lines a planted fault puts in the spectra, following the generator's physics (shared/synth/fault-signal.ts). */
export interface PlantedLines { orders: SynthLine[]; envelope: SynthLine[]; lineOrder: number }

/**
 * The lines of one planted fault: shaft 1×/2× (raw); bearing impacts → defect harmonics in the
 * envelope, with ±modulation sidebands (inner race on a turning inner ring, outer race on a turning
 * outer ring: ±1× part speed; ball: ±cage speed); belt: belt-pass harmonics in both spectra.
 * `partOrder` is the part's actual speed (ratio after creep); `slip` the cage lag (fraction).
 */
export function plantedLines(
  fault: 'shaft' | 'outer_race' | 'inner_race' | 'ball' | 'cage' | 'belt',
  partOrder: number,
  factors: { ftf: number; bpfo: number; bpfi: number; bsf: number },
  ring: 'inner' | 'outer',
  slip: number,
  snrDb = 18,
): PlantedLines {
  if (fault === 'shaft') return { orders: [{ order: partOrder, snrDb }, { order: 2 * partOrder, snrDb: snrDb - 6 }], envelope: [], lineOrder: partOrder };
  if (fault === 'belt') {
    const lines = [1, 2, 3].map((k) => ({ order: k * partOrder, snrDb: snrDb - 4 * (k - 1) }));
    return { orders: lines, envelope: lines, lineOrder: partOrder };
  }
  const cage = factors.ftf * (1 - slip);
  let rate: number; let modulation: number | null = null;
  switch (fault) {
    case 'outer_race': rate = ring === 'outer' ? factors.bpfo + factors.bpfi * slip : factors.bpfo * (1 - slip); if (ring === 'outer') modulation = 1; break;
    case 'inner_race': rate = ring === 'inner' ? factors.bpfi + factors.bpfo * slip : factors.bpfi * (1 - slip); if (ring === 'inner') modulation = 1; break;
    case 'ball': rate = 2 * factors.bsf * (1 - slip); modulation = cage; break;
    default: rate = cage;
  }
  const f = rate * partOrder;
  const envelope: SynthLine[] = [];
  for (let k = 1; k <= 3; k += 1) {
    envelope.push({ order: k * f, snrDb: snrDb - 3 * (k - 1) });
    if (modulation !== null && k <= 2) {
      envelope.push({ order: k * f - modulation * partOrder, snrDb: snrDb - 8 - 3 * (k - 1) });
      envelope.push({ order: k * f + modulation * partOrder, snrDb: snrDb - 8 - 3 * (k - 1) });
    }
  }
  if (modulation !== null) envelope.push({ order: modulation * partOrder, snrDb: snrDb - 6 });
  return { orders: [], envelope, lineOrder: f };
}
