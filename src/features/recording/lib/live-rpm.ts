import { AnalysisInputError } from '../../../../shared/analysis/analysis-input-error';
import { trackSpeedFromPickup } from '../../../../shared/analysis/pickup-speed';
import { extractReference } from '../../../../shared/analysis/reference';
import { FftPlanCache } from '../../../../shared/dsp/fft';
import { AnalysisSettingsSchema, FALLBACK_EXPECTED_RPM, type RefKind } from '../../../../shared/schemas/analysis-settings';

/** What the recorder knows about the engine and the wiring, for reading speed while recording. */
export interface LiveRpmSetup {
  cylinders: number;
  idleRpm?: number | null;
  /** Reference kind of the clamp on input 1; null = no reference (one-channel recording). */
  refKind: RefKind | null;
}

/**
 * The crank speed in the last seconds of a recording, as the analysis reads it (the same shared
 * code): from the reference pulses on input 1 (whole pulse pitches over their time), or, without a
 * reference, from the pickup's firing-order line. Null when nothing readable is there yet.
 */
export function liveRpm(channels: readonly Float32Array[], sampleRateHz: number, setup: LiveRpmSetup): { rpm: number; from: 'reference' | 'pickup' } | null {
  if (channels.length === 0 || channels[0].length < sampleRateHz) return null;
  try {
    if (setup.refKind && channels.length >= 2) {
      const settings = AnalysisSettingsSchema.parse({ refKind: setup.refKind, cylinders: setup.cylinders });
      const ref = extractReference(channels[0], sampleRateHz, settings, null);
      const n = ref.timesS.length;
      if (n < 3) return null;
      const rpm = ((ref.anglesDeg[n - 1] - ref.anglesDeg[0]) / 360 / (ref.timesS[n - 1] - ref.timesS[0])) * 60;
      return Number.isFinite(rpm) ? { rpm, from: 'reference' } : null;
    }
    const pickup = channels[channels.length >= 2 ? 1 : 0];
    const track = trackSpeedFromPickup(pickup, sampleRateHz, {
      cylinders: setup.cylinders, expectedRpm: setup.idleRpm ?? FALLBACK_EXPECTED_RPM, minRpm: 300, maxRpm: 8000,
    }, new FftPlanCache());
    return { rpm: track.meanRpm, from: 'pickup' };
  } catch (error) {
    if (error instanceof AnalysisInputError) return null;
    throw error;
  }
}
