import { describe, expect, it } from 'vitest';
import { generateCapture } from '../../../shared/synth/generate-capture';
import { beltPassOrder, speedRatio } from '../../../shared/drive/kinematics';
import { bearingFactors } from '../../../shared/drive/bearing-factors';
import type { DriveDocument } from '../../../shared/drive/types';
import type { GenerateOptionsInput } from '../../../shared/synth/options';
import { drives } from '../../helpers/scenarios';
import { bandEnvelope, floorNear, hannSpectrum, peakNear } from './signal-checks';

// Constant speed (no wander, no firing fluctuation) so that an order is a fixed frequency and a
// plain FFT of 4 s at 32 768 Hz (2^17 samples, 0.25 Hz bins) resolves the planted lines. The
// envelope is the magnitude of the analytic signal of the resonance band (Randall & Antoni,
// MSSP 25(2), 2011: envelope analysis of bearing impacts).
const base = { durationS: 4, sampleRateHz: 32768, wanderPct: 0, firingFluctuationPct: 0, rpm: 780, snrDb: 10, resonanceHz: 4000 } as const;
const crankHz = 780 / 60;

function envelopeOf(options: Omit<GenerateOptionsInput, 'drive'> & { drive: DriveDocument }) {
  const capture = generateCapture({ ...base, ...options });
  const f = capture.truth.fault!;
  const env = bandEnvelope(capture.channels[1], capture.sampleRateHz, capture.truth.resonanceHz - 1000, capture.truth.resonanceHz + 1000);
  return { truth: capture.truth, fault: f, spec: hannSpectrum(env, capture.sampleRateHz) };
}

describe('planted bearing faults', () => {
  it('puts an unmodulated outer-race line at BPFO × part speed after creep and slip (inner ring turning)', () => {
    const drive = drives.i4Petrol;
    const { fault, spec } = envelopeOf({ drive, seed: 21, fault: { component: 'Alternator', fault: 'outer_race' }, creepPct: 1, rollingSlipPct: 1.5 });
    // Ratio and factors from shared/drive (docs/references.md §1 formulas); the fixed race's line falls by the cage lag.
    const ratio = speedRatio(drive, 'Alternator');
    const f = bearingFactors(drive.components.find((c) => c.name === 'Alternator')!.bearing).factors;
    expect(fault.nominalOrder).toBeCloseTo(ratio * f.bpfo, 9);
    expect(fault.plantedOrder).toBeCloseTo(ratio * 0.99 * f.bpfo * 0.985, 9);
    const expectedHz = fault.plantedOrder * crankHz;
    const peak = peakNear(spec, expectedHz, 0.04 * expectedHz);
    expect(Math.abs(peak.freqHz - expectedHz)).toBeLessThan(0.25);
    expect(peak.amp).toBeGreaterThan(5 * floorNear(spec, expectedHz, 10));
    // The slipped line is resolved from the nominal one (2.5 % away: about 10 bins).
    expect(Math.abs(peak.freqHz - fault.nominalOrder * crankHz)).toBeGreaterThan(1.5);
    // No ±1× shaft sidebands: the outer race is fixed and the load zone with it.
    const shaftHz = fault.partOrder * crankHz;
    for (const side of [-1, 1]) expect(peakNear(spec, expectedHz + side * shaftHz, 0.3).amp).toBeLessThan(0.2 * peak.amp);
  });

  it('modulates an outer-ring-turning idler\'s outer-race line at the pulley 1×, and raises it by the slip', () => {
    const drive = drives.i4Petrol;
    const { fault, spec } = envelopeOf({ drive, seed: 22, fault: { component: 'Upper idler', fault: 'outer_race' }, creepPct: 1, rollingSlipPct: 2 });
    expect(fault.rotatingRing).toBe('outer');
    expect(fault.plantedOrder).toBeGreaterThan(fault.partOrder * fault.factors!.bpfo);
    const carrierHz = fault.plantedOrder * crankHz;
    const carrier = peakNear(spec, carrierHz, 0.5);
    expect(Math.abs(carrier.freqHz - carrierHz)).toBeLessThan(0.25);
    const shaftHz = fault.partOrder * crankHz;
    for (const side of [-1, 1]) {
      const sb = peakNear(spec, carrierHz + side * shaftHz, 0.5);
      expect(Math.abs(sb.freqHz - (carrierHz + side * shaftHz))).toBeLessThan(0.3);
      expect(sb.amp).toBeGreaterThan(0.15 * carrier.amp);
    }
  });

  it('gives an inner-race line with ±1× shaft sidebands (inner ring turning)', () => {
    const { fault, spec } = envelopeOf({ drive: drives.i4Petrol, seed: 23, fault: { component: 'Water pump', fault: 'inner_race' }, creepPct: 2 });
    const carrierHz = fault.plantedOrder * crankHz;
    expect(fault.modulationOrder).toBeCloseTo(fault.partOrder, 9);
    const carrier = peakNear(spec, carrierHz, 0.5);
    expect(Math.abs(carrier.freqHz - carrierHz)).toBeLessThan(0.25);
    for (const side of [-1, 1]) {
      const at = carrierHz + side * fault.partOrder * crankHz;
      expect(peakNear(spec, at, 0.5).amp).toBeGreaterThan(0.2 * carrier.amp);
    }
  });

  it('strikes a ball defect at 2×BSF with ±FTF (cage) sidebands', () => {
    const { fault, spec } = envelopeOf({ drive: drives.i4Petrol, seed: 24, durationS: 4, fault: { component: 'A/C compressor', fault: 'ball' }, rollingSlipPct: 1 });
    expect(fault.nominalOrder).toBeCloseTo(fault.ratio * 2 * fault.factors!.bsf, 9);
    const carrierHz = fault.plantedOrder * crankHz;
    const carrier = peakNear(spec, carrierHz, 0.5);
    expect(Math.abs(carrier.freqHz - carrierHz)).toBeLessThan(0.25);
    const cageHz = fault.modulationOrder! * crankHz;
    expect(cageHz).toBeCloseTo(fault.partOrder * fault.factors!.ftf * 0.99 * crankHz, 6);
    for (const side of [-1, 1]) expect(peakNear(spec, carrierHz + side * cageHz, 0.4).amp).toBeGreaterThan(0.2 * carrier.amp);
  });

  it('puts a cage fault at FTF × part speed, lowered by the slip', () => {
    const { fault, spec } = envelopeOf({ drive: drives.i4Petrol, seed: 25, fault: { component: 'Tensioner', fault: 'cage' }, rollingSlipPct: 1.5, creepPct: 0.5 });
    expect(fault.plantedOrder).toBeCloseTo(fault.partOrder * fault.factors!.ftf * 0.985, 9);
    const lineHz = fault.plantedOrder * crankHz;
    const peak = peakNear(spec, lineHz, 0.5);
    expect(Math.abs(peak.freqHz - lineHz)).toBeLessThan(0.25);
    expect(peak.amp).toBeGreaterThan(5 * floorNear(spec, lineHz, 5));
  });
});

describe('planted shaft and belt faults', () => {
  it('adds 1× and 2× lines at the part\'s speed after creep, in the raw spectrum', () => {
    const capture = generateCapture({ ...base, drive: drives.i4Petrol, seed: 26, fault: { component: 'Power steering pump', fault: 'shaft', amplitude: 0.3 }, creepPct: 2.5, snrDb: -3 });
    const fault = capture.truth.fault!;
    expect(fault.plantedOrder).toBeCloseTo(speedRatio(drives.i4Petrol, 'Power steering pump') * 0.975, 9);
    const spec = hannSpectrum(capture.channels[1], capture.sampleRateHz);
    for (const k of [1, 2]) {
      const hz = k * fault.plantedOrder * crankHz;
      const peak = peakNear(spec, hz, 0.3);
      expect(Math.abs(peak.freqHz - hz)).toBeLessThan(0.1);
      // Hann coherent-gain-corrected amplitude of the 0.3 (1×) and 0.15 (2×) sinusoids.
      expect(peak.amp).toBeCloseTo(0.3 / k, 1);
    }
  });

  it('puts a belt line at the belt-pass order of REFERENCES.md §5\'s worked example (D 160 mm, L 1900 mm, 750 rpm → 3.3069 Hz)', () => {
    const drive: DriveDocument = {
      name: 'Worked example', cylinders: 4, firingOrder: [1, 3, 4, 2],
      belts: [{ name: 'Belt', lengthMm: 1900, driver: 'Crankshaft', driverPulleyMm: 160 }],
      components: [{ name: 'Crankshaft', kind: 'crankshaft' }, { name: 'Pump', kind: 'water_pump', belt: 'Belt', pulleyMm: 160 }],
    };
    // Derived in docs/references.md §5: belt-pass order 0.26456.
    expect(beltPassOrder(drive, 'Belt')).toBeCloseTo(0.26456, 5);
    const capture = generateCapture({ ...base, durationS: 8, sampleRateHz: 8192, rpm: 750, drive, seed: 27, fault: { component: 'Belt', fault: 'belt' }, resonanceHz: 3000 });
    const fault = capture.truth.fault!;
    expect(fault.target).toBe('belt');
    expect(fault.nominalOrder).toBeCloseTo(0.26456, 5);
    expect(fault.plantedOrder).toBeCloseTo(fault.nominalOrder, 12);
    const spec = hannSpectrum(capture.channels[1], capture.sampleRateHz);
    const peak = peakNear(spec, 3.3069, 0.6);
    expect(Math.abs(peak.freqHz - 3.3069)).toBeLessThan(0.06);
  });
});

describe('noise at the given SNR', () => {
  it('sets the noise power in the analysis band to the fault power / 10^(SNR/10)', () => {
    const quiet = { ...base, drive: drives.i4Petrol, seed: 28, engineLevel: 0, injectorTicks: [], fault: { component: 'Alternator', fault: 'outer_race' as const } };
    const clean = generateCapture({ ...quiet, snrDb: 80 });
    const noisy = generateCapture({ ...quiet, snrDb: -3 });
    expect(noisy.truth.snr.bandHz).toEqual([3000, 5000]);
    // Same seed: the same fault and the same noise draws, scaled; their difference is (almost all) the noise.
    const noise = Float64Array.from(noisy.channels[1], (v, i) => v - clean.channels[1][i]);
    let faultPower = 0;
    for (const v of clean.channels[1]) faultPower += v * v;
    faultPower /= clean.channels[1].length;
    // Noise power inside the band from a rectangular-window periodogram (Parseval).
    const spec = hannSpectrum(noise, noisy.sampleRateHz);
    const [lo, hi] = noisy.truth.snr.bandHz;
    let bandPower = 0;
    // Hann amplitude bins: a bin of amplitude A holds A²/2 of a tone; for noise divide by the Hann ENBW (1.5 bins).
    for (let k = Math.ceil(lo / spec.binHz); k <= Math.floor(hi / spec.binHz); k++) bandPower += (spec.amp[k] ** 2) / 2 / 1.5;
    const snrDb = 10 * Math.log10(faultPower / bandPower);
    expect(snrDb).toBeGreaterThan(-3.5);
    expect(snrDb).toBeLessThan(-2.5);
  });
});
