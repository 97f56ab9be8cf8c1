import { CaptureFormatError } from '../formats/capture-format-error';
import { decimateByTwo, designHalfBand, designLowPass, kaiserLength } from '../dsp/fir';
import { FftPlanCache, nextPowerOfTwo } from '../dsp/fft';
import { overlapSaveFilter } from '../dsp/overlap-save';
import { type AnalysisSettings, AnalysisSettingsSchema, FALLBACK_EXPECTED_RPM } from '../schemas/analysis-settings';
import { type DriveDocument } from '../drive/types';
import { AnalysisInputError } from './analysis-input-error';
import { checkPickupNotFlat, checkSpeedPlausible } from './signal-checks';
import { resampleAtAngles } from './angle-resample';
import { crankAngle, crankSpeed } from './crank-speed';
import { cycleView } from './cycle-view';
import { chooseEnvelopeBands } from './envelope-choice';
import { envelopeSpectra } from './envelope-spectrum';
import { commonFiringOrder } from './firing-order';
import { orderPeaks } from './order-peaks';
import { orderSpectrum } from './order-spectrum';
import { type OrderMap, orderMap, SWEEP_RATIO } from './order-tracks';
import { type PickupSpeedTrack, referenceFromTrack, trackSpeedFromPickup } from './pickup-speed';
import { extractReference, type ReferenceResult } from './reference';
import { spectrogram } from './spectrogram';
import { subtractAverage, synchronousAverage } from './synchronous-average';
import { type AnalysisResult, type EnvelopeBand, type RankingEntry, type RankingInput, type Warning } from './types';

/**
 * The analysis pipeline (docs/design.md steps 1–8) over decoded channels: reference edges → crank angle
 * and speed → order spectrum of the pickup → envelope of the best impulsive bands (residual after
 * the 720° average) → engine-cycle view → spectrogram → peaks → ranking (when the caller passes
 * `rank`, built from a drive document; shared/analysis never imports the ranking). The CLI, the
 * workers and the tests all call this one function. Pure apart from `performance.now()` timings.
 */
export interface PipelineInput {
  channels: Float32Array[] | Float64Array[];
  sampleRateHz: number;
  format?: string;
  channelNames?: string[];
  channelUnits?: (string | null)[];
}

export interface PipelineOptions {
  drive?: DriveDocument;
  rank?: (input: RankingInput) => RankingEntry[];
  /** Notes from the reader (become warnings). */
  notes?: string[];
  /** Time spent reading the file, reported as timingsMs.read. */
  readMs?: number;
}

const ENVELOPE_LOW_HZ = 300;

/**
 * The plan's constants, each with its reason. Rates are chosen once from the
 * capture's speed range and the settings; the stages below only follow them.
 */
const PLAN = {
  /** Keep decimating by two while the rate still carries this many times the envelope's top frequency (2 for Nyquist, 0.5 of margin for the half-band's transition). */
  envelopeRateMargin: 2.5,
  /** Usable fraction of a rate after the half-band decimator (its passband edge, shared/dsp/fir.ts). */
  usableAfterDecimation: 0.4,
  /** Usable fraction of the recorder's own rate (its anti-alias filter's passband, common practice). */
  usableRaw: 0.45,
  /** Highest order an angle-domain rate carries: 0.4 of its samples per revolution, as above. */
  ordersPerSample: 0.4,
  /** Speed margin of the anti-alias edges beyond the measured range (speed measured per pulse, ±2 %). */
  speedMargin: 0.02,
  /** The anti-alias transition needs the stop edge at least this far above the pass edge, else the pass edge drops to stop / `passFromStop`. */
  minStopOverPass: 1.05,
  passFromStop: 1.3,
  /** Decimate the order path while the stop edge stays under 0.2 of the rate (room for the cubic reader, 0.1·fs accuracy ×2) and the pass edge under 1/8 of it. */
  orderDecimateStop: 0.2,
  orderDecimatePass: 8,
  /** Angle-domain envelope rate: this many times the usable band's top at the slowest speed (Nyquist plus 10 % of margin). */
  envelopeSprMargin: 2.2,
} as const;

/** Runs the whole analysis; throws CaptureFormatError / AnalysisInputError on unusable input. */
export function runPipeline(input: PipelineInput, settingsIn: AnalysisSettings, options: PipelineOptions = {}): AnalysisResult {
  const clock = () => performance.now();
  const tStart = clock();
  const settings = AnalysisSettingsSchema.parse(settingsIn);
  const fs = input.sampleRateHz;
  if (!(fs > 0 && Number.isFinite(fs))) throw new RangeError(`sample rate must be a positive number of Hz, got ${fs}`);
  const warnings: Warning[] = (options.notes ?? []).map((message) => ({ code: 'reader_note', message }));
  const nch = input.channels.length;
  const fromPickup = settings.speedSource === 'pickup';
  // Speed from the pickup: the reference and cam channels are not read, so they need not exist.
  const roles: [string, number][] = fromPickup ? [['--pickup-channel', settings.pickupChannel]]
    : [['--ref-channel', settings.refChannel], ['--pickup-channel', settings.pickupChannel]];
  if (settings.camChannel && !fromPickup) roles.push(['--cam-channel', settings.camChannel]);
  for (const [flag, ch] of roles) {
    if (ch > nch) {
      throw new CaptureFormatError('too_few_channels',
        `the capture has ${nch} channel${nch === 1 ? '' : 's'} but ${flag} ${ch} asks for channel ${ch}; record the reference and the pickup together or fix ${flag}${nch === 1 ? ' (a one-channel recording: --pickup-channel 1 --speed-source pickup reads speed from the pickup)' : ''}`);
    }
  }
  // One channel cannot carry two roles: the reference pulses would swamp the vibration spectrum
  // (or the cam pulse would be read as a crank pulse), and the result would look plausible.
  for (let i = 0; i < roles.length; i++) {
    for (let j = i + 1; j < roles.length; j++) {
      if (roles[i][1] === roles[j][1]) {
        throw new AnalysisInputError('channel_conflict',
          `${roles[i][0]} and ${roles[j][0]} both name channel ${roles[i][1]}; each role needs its own channel, so give the channel each signal was recorded on`);
      }
    }
  }
  const n = input.channels[0].length;
  const durationS = n / fs;
  const scale = (ch: number) => settings.channelScales[ch - 1] ?? 1;
  const ref = fromPickup ? null : toFloat32(input.channels[settings.refChannel - 1], scale(settings.refChannel));
  const cam = settings.camChannel && !fromPickup ? toFloat32(input.channels[settings.camChannel - 1], 1) : null;
  const pickupRaw = input.channels[settings.pickupChannel - 1];
  const pickupScale = scale(settings.pickupChannel);
  checkPickupNotFlat(pickupRaw, settings.pickupChannel);
  let firingOrder = settings.firingOrder;
  if (!firingOrder) {
    firingOrder = commonFiringOrder(settings.cylinders);
    warnings.push({ code: 'firing_order_assumed', message: `no firing order given; the cycle view uses ${firingOrder.join('-')}, the common order for ${settings.cylinders} cylinders (give --firing-order)` });
  }
  const resolved: AnalysisSettings = { ...settings, firingOrder };
  const plans = new FftPlanCache();
  const t: Record<string, number> = {};

  // 2–3. Reference and crank speed.
  let t0 = clock();
  let reference: ReferenceResult;
  let pickupTrack: PickupSpeedTrack | null = null;
  if (ref) {
    reference = extractReference(ref, fs, settings, cam);
  } else {
    const expectedRpm = settings.expectedRpm ?? options.drive?.idleRpm ?? FALLBACK_EXPECTED_RPM;
    pickupTrack = trackSpeedFromPickup(pickupRaw, fs, { cylinders: settings.cylinders, expectedRpm, minRpm: settings.minRpm, maxRpm: settings.maxRpm }, plans);
    reference = referenceFromTrack(pickupTrack, durationS);
    warnings.push({
      code: 'speed_from_pickup',
      message: `no reference: speed read from the pickup's strongest engine line, taken as the firing order ${pickupTrack.firingOrder} of ${settings.cylinders} cylinders near ${expectedRpm.toFixed(0)} rpm (confidence ${pickupTrack.confidence.toFixed(2)}); every order is relative to that assumption, and the engine-cycle view is unavailable`,
    });
  }
  warnings.push(...reference.warnings);
  const crank = crankAngle(reference);
  const speed = crankSpeed(reference, crank, durationS);
  if (pickupTrack) {
    speed.source = 'pickup';
    speed.fromPickup = {
      firingOrder: pickupTrack.firingOrder, confidence: pickupTrack.confidence, lineDb: pickupTrack.lineDb,
      presentFraction: pickupTrack.presentFraction, marginDb: pickupTrack.marginDb,
    };
  }
  if (speed.meanRpm < settings.minRpm || speed.meanRpm > settings.maxRpm) {
    warnings.push({ code: 'rpm_implausible', message: `mean speed ${speed.meanRpm.toFixed(0)} rpm is outside ${settings.minRpm}–${settings.maxRpm} rpm; check --ref-kind and --ref-per-cycle` });
  }
  checkSpeedPlausible(speed.meanRpm, settings.minRpm, settings.maxRpm);
  const meanShaftHz = speed.meanRpm / 60;
  const minShaftHz = (Math.min(speed.minRpm, speed.meanRpm) / 60) * (1 - PLAN.speedMargin);
  const maxShaftHz = (Math.max(speed.maxRpm, speed.meanRpm) / 60) * (1 + PLAN.speedMargin);
  t.speed = clock() - t0;

  // 4. Order tracking: half-band decimation, anti-alias low-pass, resampling at constant angle.
  t0 = clock();
  const half = designHalfBand();
  // Decimate straight from the float32 channel (no full-rate float64 copy), scale afterwards.
  let xE: Float64Array | null = null;
  let fsE = fs;
  while (fsE / 2 >= PLAN.envelopeRateMargin * settings.envelopeMaxHz) { xE = decimateByTwo(xE ?? pickupRaw, half); fsE /= 2; }
  if (!xE) xE = toFloat64(pickupRaw, pickupScale);
  else if (pickupScale !== 1) for (let i = 0; i < xE.length; i++) xE[i] *= pickupScale;
  const usableHz = (fsE < fs ? PLAN.usableAfterDecimation : PLAN.usableRaw) * fsE;
  const maxOrder = settings.maxOrder;
  let spr = settings.samplesPerRev;
  while (maxOrder > PLAN.ordersPerSample * spr) spr *= 2;
  if (spr !== settings.samplesPerRev) warnings.push({ code: 'samples_per_rev_raised', message: `samples per revolution raised to ${spr} to reach order ${maxOrder}` });
  let passHz = maxOrder * maxShaftHz;
  const stopHz = (spr - maxOrder) * minShaftHz;
  if (stopHz <= passHz * PLAN.minStopOverPass) {
    passHz = stopHz / PLAN.passFromStop;
    warnings.push({ code: 'speed_range_wide', message: `speed varies too much (${speed.minRpm.toFixed(0)}–${speed.maxRpm.toFixed(0)} rpm) for orders up to ${maxOrder} at every speed; the highest orders are attenuated at the fast end` });
  }
  let xO = xE;
  let fsO = fsE;
  while (PLAN.orderDecimateStop * fsO >= stopHz && fsO / 2 >= PLAN.orderDecimatePass * passHz) { xO = decimateByTwo(xO, half); fsO /= 2; }
  // Anti-alias whenever the stop edge lies below the resampler's input Nyquist.
  if (stopHz < fsO / 2) {
    const cutoff = (passHz + stopHz) / 2 / fsO;
    const len = Math.min(4001, kaiserLength((stopHz - passHz) / fsO, 80));
    xO = overlapSaveFilter(xO, designLowPass(cutoff, len, 80), plans);
  }
  const count = Math.floor(((crank.lastDeg - crank.firstDeg) / 360) * spr);
  const revs = count / spr;
  let rpb = settings.revsPerBlock;
  while (rpb > 4 && revs < 2 * rpb) rpb /= 2;
  if (revs < rpb) {
    throw new AnalysisInputError('too_short', `the reference covers only ${revs.toFixed(1)} revolutions; record at least 10 seconds (or 40 revolutions)`);
  }
  if (rpb !== settings.revsPerBlock) {
    warnings.push({ code: 'short_capture', message: `only ${revs.toFixed(0)} revolutions: revolutions per block lowered to ${rpb} (resolution ${(1 / rpb).toFixed(3)} order); record longer for finer resolution` });
  }
  const xAng = resampleAtAngles(xO, fsO, crank.timeAt, crank.firstDeg, count, spr);
  const orders = orderSpectrum(xAng, spr, rpb, maxOrder, plans);
  // A sweep (run-up, run-down) also gets an order map, for order tracks against rpm (issue 20 item 5).
  const sweepMap: OrderMap | undefined = speed.maxRpm >= SWEEP_RATIO * speed.minRpm && revs >= 16
    ? orderMap(xAng, spr, crank.firstDeg, (deg) => crank.timeAt.at(deg), maxOrder, plans)
    : undefined;
  t.orders = clock() - t0;

  // 5. Envelope of the residual after the 720° average, in the angle domain at a high rate.
  t0 = clock();
  // Enough samples per revolution to carry the usable band at the slowest speed (2.2 × its top),
  // not more: the rate fsE itself is often far above that once rounded up to a power of two.
  const hiSpr = Math.max(2 * spr, nextPowerOfTwo(Math.min(fsE / meanShaftHz, (PLAN.envelopeSprMargin * usableHz) / minShaftHz)));
  const tdcDeg = reference.cycleOriginDeg + settings.tdcOffsetDeg;
  const cycleStart = tdcDeg + 720 * Math.ceil((crank.firstDeg - tdcDeg) / 720);
  const hiCount = Math.max(0, Math.floor(((crank.lastDeg - cycleStart) / 360) * hiSpr));
  let rpbE = rpb;
  while (rpbE > 2 && hiCount < hiSpr * rpbE) rpbE /= 2;
  if (hiCount < hiSpr * rpbE) {
    throw new AnalysisInputError('too_short', `the capture holds less than one whole engine cycle after cylinder-1 TDC; record at least 10 seconds`);
  }
  // TODO(accuracy of the envelope path): read from upsampleByTwo(xE) at 2·fsE (−37 dB instead of −16 dB error
  // at 0.3·fsE, tests/shared/dsp/interpolate.test.ts); switching it on moved the cycle view's
  // impulsive-event detector below its threshold on a −3 dB generated capture, so the detector's
  // threshold needs retuning on the more accurate signal first.
  const xHi = resampleAtAngles(xE, fsE, crank.timeAt, cycleStart, hiCount, hiSpr);
  const avg = synchronousAverage(xHi, 2 * hiSpr);
  const residualOk = avg.cycles >= 2;
  // 6. The engine-cycle view reads the angle-domain pickup before the residual replaces it in place.
  const t1 = clock();
  const cycleFull = cycleView({
    x: xHi, samplesPerRev: hiSpr, tdcOffsetDeg: settings.tdcOffsetDeg, firingOrder,
    phaseResolved: reference.phaseResolved, ambiguityDeg: reference.ambiguityDeg, plans, average: avg.average,
  });
  // Without a reference the 720° phase is unknown and the angle is integrated from a speed
  // estimate: no event is placed in a cylinder's slot, no cycle view drawn.
  const cycle: typeof cycleFull = pickupTrack
    ? { tdcOffsetDeg: cycleFull.tdcOffsetDeg, phaseResolved: false, cyclesAveraged: cycleFull.cyclesAveraged, event: null, available: false }
    : cycleFull;
  t.cycle = clock() - t1;
  const residual = residualOk ? subtractAverage(xHi, avg.average, xHi) : xHi;
  if (!residualOk) warnings.push({ code: 'no_cycle_average', message: 'fewer than two engine cycles: the envelope band was chosen without removing the engine cycle' });
  const given = settings.envelopeBand !== 'auto';
  let bands: { bandHz: [number, number]; score: number }[];
  if (settings.envelopeBand !== 'auto') {
    let [lo, hi] = settings.envelopeBand;
    if (hi > usableHz) {
      warnings.push({ code: 'envelope_band_clipped', message: `envelope band ${lo}–${hi} Hz reaches above the usable ${usableHz.toFixed(0)} Hz of this capture; clipped` });
      hi = usableHz;
      lo = Math.min(lo, hi - 100);
    }
    bands = [{ bandHz: [lo, hi], score: NaN }];
  } else {
    const minWidthHz = Math.max(500, 40 * meanShaftHz);
    bands = chooseEnvelopeBands({
      residual, samplesPerRev: hiSpr, revsPerBlock: rpbE, meanShaftHz,
      search: {
        rateHz: hiSpr * meanShaftHz, loHz: ENVELOPE_LOW_HZ, hiHz: usableHz, minWidthHz, maxWidthHz: 4 * minWidthHz, count: 3,
        cyclePeriod: residualOk ? 2 * hiSpr : undefined,
      },
    }, plans);
  }
  const envSpecs = envelopeSpectra(residual, hiSpr, rpbE, bands.map((b) => [b.bandHz[0] / meanShaftHz, b.bandHz[1] / meanShaftHz]), maxOrder, plans);
  t.envelope = clock() - t0 - t.cycle;

  // 7. Spectrogram.
  t0 = clock();
  const spec = spectrogram(xE, fsE, crank, plans);
  t.spectrogram = clock() - t0;

  // 8. Peaks.
  t0 = clock();
  const orderPk = orderPeaks(orders, settings.cylinders);
  const envBands: EnvelopeBand[] = bands.map((b, i) => ({
    bandHz: [round(b.bandHz[0], 1), round(b.bandHz[1], 1)], score: Number.isFinite(b.score) ? b.score : 0,
    spectrum: envSpecs[i], peaks: orderPeaks(envSpecs[i], settings.cylinders),
  }));
  sanityCheck(orderPk, settings.cylinders, warnings);
  t.peaks = clock() - t0;

  // Ranking (the caller's, from the drive document).
  t0 = clock();
  const ranking = options.rank
    ? options.rank({ orders, envelopes: envBands, cylinders: settings.cylinders, cyclesAveraged: cycle.cyclesAveraged, meanRpm: speed.meanRpm })
    : [];
  t.ranking = clock() - t0;
  const read = options.readMs ?? 0;
  const total = clock() - tStart + read;
  return {
    capture: { sampleRateHz: fs, durationS, channels: nch, format: input.format, channelNames: input.channelNames, channelUnits: input.channelUnits },
    settings: resolved,
    speed,
    orders: { spectrum: orders, peaks: orderPk },
    envelope: {
      bandHz: envBands[0].bandHz, bandChoice: given ? 'given' : 'auto', resolution: envSpecs[0].resolution,
      peaks: envBands[0].peaks, bands: envBands, residual: residualOk,
    },
    cycle,
    spectrogram: spec,
    ...(sweepMap ? { orderMap: sweepMap } : {}),
    ranking,
    warnings,
    timingsMs: {
      read, speed: t.speed, orders: t.orders, envelope: t.envelope, cycle: t.cycle,
      spectrogram: t.spectrogram, peaks: t.peaks, ranking: t.ranking, total,
    },
  };
}

/** Largest whole factor a wrong pulse count or cylinder count is looked for at (8 per cycle vs 1, and back). */
const MISMATCH_MAX_FACTOR = 8;

/**
 * Warns when the strongest engine line sits at a whole multiple (2×…8×) or at ½ of the firing
 * order: every order scales by (pulses assumed / pulses on the reference), so a wrong pulse count
 * or cylinder count moves the firing line by such a factor. Lower fractions are left out, since a
 * misfire or an unequal cylinder makes the 0.5 and 1.0 lines strong on a healthy reference.
 */
function sanityCheck(peaks: AnalysisResult['orders']['peaks'], cylinders: number, warnings: Warning[]): void {
  const firing = cylinders / 2;
  const strongest = peaks.find((p) => p.engineOrder !== null);
  if (!strongest || strongest.engineOrder === null) return;
  const eo = strongest.engineOrder;
  for (let k = 2; k <= MISMATCH_MAX_FACTOR; k++) {
    const above = Math.abs(eo - k * firing) < 1e-9;
    // Below the firing order only ½: a misfire or an unequal cylinder makes 0.5 and 1.0 strong.
    if (!above && (k > 2 || Math.abs(eo - firing / k) >= 1e-9)) continue;
    const factor = k === 2 ? (above ? 'twice' : 'half') : (above ? `${k} times` : `1/${k} of`);
    warnings.push({
      code: 'firing_order_mismatch',
      message: `the strongest engine line is at order ${eo}, ${factor} the firing order ${firing} of ${cylinders} cylinders; the reference pulse count (--ref-kind / --ref-per-cycle) or --cylinders is probably wrong`,
    });
    return;
  }
}

function toFloat32(x: Float32Array | Float64Array, scale: number): Float32Array {
  if (x instanceof Float32Array && scale === 1) return x;
  const y = new Float32Array(x.length);
  for (let i = 0; i < x.length; i++) y[i] = x[i] * scale;
  return y;
}

function toFloat64(x: Float32Array | Float64Array, scale: number): Float64Array {
  const y = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) y[i] = x[i] * scale;
  return y;
}

function round(v: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(v * f) / f;
}
