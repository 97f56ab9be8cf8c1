import { createReadStream } from 'node:fs';
import { basename } from 'node:path';
import { Piscina } from 'piscina';
import { AnalysisInputError } from '../shared/analysis/analysis-input-error';
import { toAnalyzeJson } from '../shared/analysis/analyze-json';
import { runPipeline } from '../shared/analysis/pipeline';
import { resolveSettings } from '../shared/analysis/resolve-settings';
import { type OrderSpectrum } from '../shared/analysis/types';
import { CaptureFormatError } from '../shared/formats/capture-format-error';
import { parseCaptureStream } from '../shared/formats/parse-capture-stream';
import { rankCapture } from '../shared/ranking/rank-capture';
import { LISTEN_RATE_HZ, listenSignal } from '../shared/analysis/listen-audio';
import { encodeWav } from '../shared/synth/encode-wav';
import { type AnalyzeFileInput, type AnalyzeFileOutput, encodeTaskError, type PickupAudioInput, type PickupAudioOutput, type SpectrumSeries, type TaskHandlers, type TaskMap } from '../shared/tasks';

/**
 * Piscina entry points, one named export per task of shared/tasks.ts: unpack → shared → pack.
 * No DB, no Express. The capture is read by an fs stream fed chunk by chunk to the shared parser;
 * the float32 series are moved out with Piscina.move (this side's buffers are detached after).
 */
const handlers = {
  async analyzeFile(input: AnalyzeFileInput): Promise<AnalyzeFileOutput> {
    try {
      const settings = resolveSettings(input.settings ?? {}, input.drive ?? null);
      const t0 = performance.now();
      const capture = await parseCaptureStream(createReadStream(input.path, { highWaterMark: 1 << 20 }), {
        name: input.name ?? basename(input.path), timeUnit: settings.timeUnit,
      });
      const readMs = performance.now() - t0;
      checkNotFlat(capture.channels[settings.pickupChannel - 1], settings.pickupChannel, input.name ?? basename(input.path));
      const drive = input.drive ?? null;
      const result = runPipeline(capture, settings, {
        drive: drive ?? undefined, rank: drive ? (inp) => rankCapture(drive, inp) : undefined, notes: capture.notes, readMs,
      });
      const f32 = (a: Float64Array) => Float32Array.from(a);
      const implausible = result.warnings.find((w) => w.code === 'rpm_implausible');
      if (implausible) {
        const meanRpm = Math.round(result.speed.meanRpm);
        throw new Error(encodeTaskError({
          code: 'implausible_rpm',
          message: `${input.name ?? basename(input.path)}: the reference gives ${meanRpm} rpm, outside ${settings.minRpm}–${settings.maxRpm} rpm; check the reference kind (one pulse per cycle, per revolution or per cylinder) and the channel marked as reference`,
        }));
      }
      const spectrum = (s: OrderSpectrum): SpectrumSeries => ({
        resolution: s.resolution, maxOrder: s.maxOrder, samplesPerRev: s.samplesPerRev, revsPerBlock: s.revsPerBlock, blocks: s.blocks,
        amplitude: f32(s.amplitude), floor: f32(s.floor),
      });
      const sg = result.spectrogram;
      const out: AnalyzeFileOutput = {
        summary: toAnalyzeJson(result),
        ranking: result.ranking,
        rankingContext: {
          cylinders: result.settings.cylinders, cyclesAveraged: result.cycle.cyclesAveraged, meanRpm: result.speed.meanRpm,
          envelopeScores: result.envelope.bands.map((b) => b.score),
        },
        series: {
          orders: spectrum(result.orders.spectrum),
          envelopes: result.envelope.bands.map((b) => ({ bandHz: b.bandHz, ...spectrum(b.spectrum) })),
          spectrogram: { frames: sg.frames, bins: sg.bins, binWidthHz: sg.binWidthHz, hopS: sg.hopS, startS: sg.startS, amplitude: sg.amplitude, rpm: sg.rpm },
          rpm: { timeS: result.speed.trace.timeS, rpm: result.speed.trace.rpm },
          cycle: { averageDeg: result.cycle.averageDeg ?? new Float32Array(720), rmsDeg: result.cycle.rmsDeg ?? new Float32Array(720) },
          ...(result.orderMap ? { orderMap: result.orderMap } : {}),
        },
      };
      return Piscina.move(movable(out) as unknown as Parameters<typeof Piscina.move>[0]) as unknown as AnalyzeFileOutput;
    } catch (e) {
      throw toTaskError(e);
    }
  },

  async pickupAudio(input: PickupAudioInput): Promise<PickupAudioOutput> {
    try {
      const name = input.name ?? basename(input.path);
      const capture = await parseCaptureStream(createReadStream(input.path, { highWaterMark: 1 << 20 }), { name });
      const channel = capture.channels[input.channel - 1];
      if (!channel) throw new AnalysisInputError('too_few_channels', `${name}: no channel ${input.channel} to listen to; the file has ${capture.channels.length}`);
      const wav = encodeWav([listenSignal(channel, capture.sampleRateHz)], LISTEN_RATE_HZ, 'pcm16');
      return Piscina.move({ [Piscina.transferableSymbol]: [wav.buffer], [Piscina.valueSymbol]: { wav } } as unknown as Parameters<typeof Piscina.move>[0]) as unknown as PickupAudioOutput;
    } catch (e) {
      throw toTaskError(e);
    }
  },
} satisfies TaskHandlers<TaskMap>;

export const { analyzeFile, pickupAudio } = handlers;

/**
 * A pickup channel with no variation (all zero, or stuck at one value) carries no vibration: the
 * analysis would rank nothing and look like a quiet engine. Refused with a stable code instead.
 */
function checkNotFlat(channel: Float32Array | undefined, number: number, name: string): void {
  if (!channel || channel.length === 0) return;
  let lo = channel[0];
  let hi = channel[0];
  for (let i = 1; i < channel.length; i++) {
    const v = channel[i];
    if (v < lo) lo = v;
    else if (v > hi) hi = v;
  }
  if (hi - lo === 0) {
    throw new Error(encodeTaskError({
      code: 'flat_channel',
      message: `${name}: the pickup (channel ${number}) is flat${hi === 0 ? ' (all zero)' : ''}; check the probe's cable and the input it was plugged into, or set which channel is the pickup`,
    }));
  }
}

/** Wraps the output so every float32 buffer goes in the transfer list. */
function movable(out: AnalyzeFileOutput) {
  const s = out.series;
  const arrays = [s.orders.amplitude, s.orders.floor, ...s.envelopes.flatMap((e) => [e.amplitude, e.floor]),
    s.spectrogram.amplitude, s.spectrogram.rpm, s.rpm.timeS, s.rpm.rpm, s.cycle.averageDeg, s.cycle.rmsDeg,
    ...(s.orderMap ? [s.orderMap.rpm, s.orderMap.amplitude] : [])];
  const buffers = [...new Set(arrays.map((a) => a.buffer as ArrayBuffer))];
  return { [Piscina.transferableSymbol]: buffers, [Piscina.valueSymbol]: out };
}

/** Errors keep only their message across the thread boundary: encode the stable code into it. */
function toTaskError(e: unknown): Error {
  if (e instanceof CaptureFormatError || e instanceof AnalysisInputError) return new Error(encodeTaskError({ code: e.code, message: e.message }));
  const err = e as { name?: string; code?: string; message?: string; issues?: { path: PropertyKey[]; message: string }[] };
  if (err?.name === 'ZodError' && err.issues?.length) {
    return new Error(encodeTaskError({ code: 'validation_failed', message: `settings ${err.issues[0].path.join('.')}: ${err.issues[0].message}` }));
  }
  if (err?.code === 'ENOENT') return new Error(encodeTaskError({ code: 'file_missing', message: 'the stored capture file is missing' }));
  return e instanceof Error ? e : new Error(String(e));
}
