/**
 * The capture generator: from a drive document and a seed, a physically plausible two-channel
 * capture (reference, pickup; plus an optional cam channel) and the truth of what was planted.
 * Pure: no fs, no clock; one seed always gives the same samples. See `GenerateOptionsSchema` for
 * the conventions and `synthesize*` modules for the physics.
 *
 * Pickup = engine vibration (0.5-order multiples) + injector ticks + planted fault + optional
 * distractor + white Gaussian noise, whose level is set by the SNR over the analysis band (see
 * `SNR_DEFINITION` and `analysisBandHz`).
 */
import type { DriveDocument } from '../drive/types';
import { createRng } from './prng';
import { GenerateOptionsSchema, type GenerateOptions, type GenerateOptionsInput, type InjectorTick } from './options';
import type { CaptureTruth } from './truth';
import { synthesizeSpeedProfile, speedSummary } from './speed-profile';
import { pulsesPerCycle, synthesizeCam, synthesizeReference } from './reference-signal';
import { addEngineVibration, addInjectorTicks, defaultInjectorTicks, describeTicks, engineOrderLines, slotOf } from './engine-signal';
import { synthesizeFault } from './fault-signal';
import { addDistractor } from './distractor';
import { meanSquare } from './rings';
import { addCombustionVariation, addHealthyShaftLines, MODULATION_DEPTH_RANGE, structuralModes } from './realism';
import { bearingFactors } from '../drive/bearing-factors';
import { findComponent } from '../drive/kinematics';

/** A generated capture: channel 1 the reference, 2 the pickup, 3 the cam (when asked). */
export interface GeneratedCapture {
  channels: Float32Array[];
  sampleRateHz: number;
  truth: CaptureTruth;
}

/** The SNR definition written into every truth file. */
export const SNR_DEFINITION =
  'SNR = 10·log10(P_fault / P_noise,band). P_fault: mean square of the planted fault signal over the capture '
  + '(without a fault, of the engine vibration). P_noise,band: power of the added white Gaussian noise inside the analysis band '
  + '(snr.bandHz): for bearing and belt faults the 2 kHz band centred on the structural resonance, where their impacts ring and the '
  + 'envelope is taken; for shaft faults and without a fault 0 … min(9 kHz, 0.45·fs), the band the analysis reads by default. '
  + 'The noise is white over 0 … fs/2, so its total power is P_noise,band × (fs/2) / bandwidth.';

/** The analysis band over which the SNR is defined, in Hz (see `SNR_DEFINITION`). */
export function analysisBandHz(fault: GenerateOptions['fault'], resonanceHz: number, sampleRateHz: number): [number, number] {
  const nyquist = sampleRateHz / 2;
  if (!fault || fault.fault === 'shaft') return [0, Math.min(9000, 0.45 * sampleRateHz)];
  return [Math.max(0, resonanceHz - 1000), Math.min(nyquist, resonanceHz + 1000)];
}

/**
 * Generates one capture. Throws RangeError naming the bad option (zod path and message), a drive
 * whose firing order does not match its cylinders, a tick on a cylinder the engine lacks, or a
 * resonance above 0.45 × the sample rate.
 */
export function generateCapture(input: GenerateOptionsInput): GeneratedCapture {
  const parsed = GenerateOptionsSchema.safeParse(input);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new RangeError(`generator option ${issue.path.join('.') || '(options)'}: ${issue.message}`);
  }
  const o = parsed.data;
  const drive = o.drive;
  checkDrive(drive);
  // One fork per signal part, always in this order, so options of one part never shift another's draws.
  const root = createRng(o.seed);
  const [speedRng, refRng, camRng, engineRng, tickRng, faultRng, distractorRng, noiseRng, paramRng] = Array.from({ length: 9 }, () => root.fork());
  // The realistic generator's draws come from a tenth fork, so today's captures stay sample for sample.
  const realRng = root.fork();
  const real = o.realism === 'real';
  const fs = o.sampleRateHz;
  const samples = Math.round(o.durationS * fs);
  const rpm = o.rpm ?? drive.idleRpm ?? 780;
  const profile = synthesizeSpeedProfile(speedRng, {
    sampleRateHz: fs, samples, rpm, rpmEnd: o.rpmEnd, wanderPct: o.wanderPct, firingFluctuationPct: o.firingFluctuationPct, cylinders: drive.cylinders,
  });

  const tickRingHz = Math.min(paramRng.between(2000, 3000), 0.4 * fs);
  const resonanceHz = o.resonanceHz ?? Math.min(paramRng.between(2500, 5500), 0.4 * fs);
  if (resonanceHz > 0.45 * fs) throw new RangeError(`resonanceHz must be below 0.45 × the sample rate (${0.45 * fs} Hz), got ${resonanceHz}`);
  const rollingSlipPct = o.rollingSlipPct ?? paramRng.between(1, 2);

  const reference = synthesizeReference(refRng, profile, o, drive.cylinders);
  const cam = o.camChannel ? synthesizeCam(camRng, profile, o.tdcOffsetDeg, o.camLeadDeg) : null;

  const engine = new Float64Array(samples);
  const engineLines = engineOrderLines(engineRng, drive.cylinders, o.engineLevel);
  addEngineVibration(engine, profile, engineLines);
  const ticks = o.injectorTicks ?? defaultInjectorTicks(tickRng, drive.firingOrder, o.engineLevel);
  checkTicks(ticks, drive.cylinders);
  const tickSignal = new Float64Array(samples);
  addInjectorTicks(tickSignal, tickRng, profile, ticks, tickRingHz);

  const modes = real ? structuralModes(realRng, resonanceHz, fs) : undefined;
  if (real) {
    addCombustionVariation(engine, realRng, profile, drive.cylinders, o.engineLevel, modes![1]);
    addHealthyShaftLines(engine, realRng, profile, drive, o.creepPct);
  }
  const planted = o.fault
    ? synthesizeFault(faultRng, profile, drive, o.fault, {
      creepPct: o.creepPct, rollingSlipPct, impactJitterPct: o.impactJitterPct, resonanceHz, modes,
      modulationDepth: real ? drawDepth(realRng, drive, o.fault) : undefined,
    })
    : null;
  const distractorSignal = new Float64Array(samples);
  const distractor = o.distractor ? addDistractor(distractorSignal, distractorRng, profile, drive, o.distractor, resonanceHz) : null;

  const signalPower = planted ? meanSquare(planted.signal) : meanSquare(engine);
  const bandHz = analysisBandHz(o.fault, resonanceHz, fs);
  const noiseRms = Math.sqrt((signalPower / 10 ** (o.snrDb / 10)) * (fs / 2 / (bandHz[1] - bandHz[0])));
  const pickup = new Float32Array(samples);
  for (let i = 0; i < samples; i++) {
    pickup[i] = engine[i] + tickSignal[i] + (planted ? planted.signal[i] : 0) + distractorSignal[i] + noiseRms * noiseRng.normal();
  }

  const channels = [Float32Array.from(reference.signal), pickup];
  if (cam) channels.push(Float32Array.from(cam.signal));
  const speed = speedSummary(profile);
  const tickTruth = describeTicks(ticks, drive.firingOrder);
  return {
    channels,
    sampleRateHz: fs,
    truth: {
      generator: 'crankwise-synth',
      version: 1,
      seed: o.seed,
      drive: drive.name,
      sampleRateHz: fs,
      durationS: samples / fs,
      channels: cam ? ['reference', 'pickup', 'cam'] : ['reference', 'pickup'],
      rpm: { nominal: rpm, end: o.rpmEnd, mean: speed.mean, min: speed.min, max: speed.max, wanderPct: o.wanderPct },
      reference: {
        kind: o.refKind,
        refPerCycle: o.refPerCycle,
        wheel: o.refKind === 'wheel' ? o.wheel : null,
        edges: reference.edges,
        gaps: reference.gaps,
        edgeAngleDeg: reference.edgeAngleDeg,
        camEdgeAngleDeg: cam ? cam.edgeAngleDeg : null,
      },
      analysis: {
        refKind: o.refKind,
        refPerCycle: o.refPerCycle,
        wheel: o.refKind === 'wheel' ? o.wheel : null,
        refPolarity: o.refPolarity,
        tdcOffsetDeg: o.tdcOffsetDeg,
        cylinders: drive.cylinders,
        firingOrder: [...drive.firingOrder],
        refChannel: 1,
        pickupChannel: 2,
        camChannel: cam ? 3 : null,
      },
      fault: planted ? planted.truth : null,
      snr: { db: o.snrDb, bandHz, definition: SNR_DEFINITION },
      noiseRms,
      resonanceHz,
      ticks: tickTruth,
      loudestTick: loudestTick(tickTruth, o, drive),
      distractor,
      engineOrders: engineLines.map((l) => ({ order: l.order, amplitude: l.amplitude })),
      channelScale: channels.map(() => 1),
    },
  };
}

/**
 * Degrees over which the reference repeats without telling cycles apart: 720 with a cam channel
 * or a cylinder-1 reference; 360 for a wheel or one pulse per revolution; 720/N for N pulses per
 * cycle (docs/references.md §5, common practice).
 */
export function ambiguityPeriodDeg(o: Pick<GenerateOptions, 'camChannel' | 'refKind' | 'refPerCycle'>, cylinders: number): number {
  if (o.camChannel) return 720;
  const perCycle = pulsesPerCycle(o, cylinders);
  return perCycle === null ? 360 : 720 / perCycle;
}

function loudestTick(ticks: CaptureTruth['ticks'], o: GenerateOptions, drive: DriveDocument): CaptureTruth['loudestTick'] {
  if (ticks.length === 0) return null;
  const loud = ticks.reduce((a, b) => (b.amplitude > a.amplitude ? b : a));
  const period = ambiguityPeriodDeg(o, drive.cylinders);
  const candidates = new Set<number>();
  for (let k = 0; k * period < 720 - 1e-9; k++) candidates.add(slotOf(loud.angleDeg + k * period, drive.firingOrder).slotCylinder);
  return { ...loud, candidates: [...candidates].sort((a, b) => a - b), phaseResolved: period >= 720 };
}

/** A modulation depth over the published-like range of the planted fault's kind (realistic generator). */
function drawDepth(rng: ReturnType<typeof createRng>, drive: DriveDocument, fault: NonNullable<GenerateOptions['fault']>): number | undefined {
  const c = findComponent(drive, fault.component);
  const ring = c ? bearingFactors(c.bearing).rotatingRing : 'inner';
  const range = fault.fault === 'inner_race' ? MODULATION_DEPTH_RANGE.inner_race
    : fault.fault === 'ball' ? MODULATION_DEPTH_RANGE.ball
      : fault.fault === 'outer_race' && ring === 'outer' ? MODULATION_DEPTH_RANGE.outer_ring : null;
  return range ? rng.between(range[0], range[1]) : undefined;
}

function checkDrive(drive: DriveDocument): void {
  const c = drive.cylinders;
  const sorted = [...drive.firingOrder].sort((a, b) => a - b);
  if (sorted.length !== c || sorted.some((v, i) => v !== i + 1)) {
    throw new RangeError(`drive "${drive.name}": firingOrder must be a permutation of 1..${c}, got [${drive.firingOrder.join(', ')}]`);
  }
}

function checkTicks(ticks: readonly InjectorTick[], cylinders: number): void {
  for (const t of ticks) {
    if (t.cylinder > cylinders) throw new RangeError(`injector tick on cylinder ${t.cylinder}, but the engine has ${cylinders} cylinders`);
  }
}
