import type { RefKind } from '../../../../shared/schemas/analysis-settings';

/**
 * The upload metadata of a browser recording, in the shape of the capture upload contract
 * (issue 15: channel roles, reference, sensor, probe point, condition, phase, source). A
 * two-channel recording has the reference on channel 1 and the contact pickup on channel 2; a
 * one-channel recording is airborne sound from a microphone, with no reference.
 */
export interface RecordingMetadata {
  channels: { role: 'reference' | 'pickup' | 'unused'; scale: number; unit: string }[];
  reference: { kind: RefKind; perCycle: null; polarity: 'auto'; tdcOffsetDeg: number } | null;
  sensorKind: 'piezo_contact' | 'microphone';
  probePoint: { label: string; component: null };
  condition: { speed: 'idle'; acClutch: 'unknown'; electricalLoad: 'unknown'; beltOff: false };
  phase: 'before';
  source: 'recording';
}

/** Metadata for `channels` recorded channels; `reference` = the clamp's kind on input 1, or null when none was wired. */
export function buildRecordingMetadata(o: { channels: number; reference: RefKind | null; probe: string }): RecordingMetadata {
  const fs = { scale: 1, unit: 'FS' };
  const extra = Array.from({ length: Math.max(0, o.channels - 2) }, () => ({ role: 'unused' as const, ...fs }));
  const contact = o.channels >= 2;
  return {
    channels: contact
      ? [{ role: o.reference ? 'reference' : 'unused', ...fs }, { role: 'pickup', ...fs }, ...extra]
      : [{ role: 'pickup', ...fs }],
    reference: contact && o.reference ? { kind: o.reference, perCycle: null, polarity: 'auto', tdcOffsetDeg: 0 } : null,
    sensorKind: contact ? 'piezo_contact' : 'microphone',
    probePoint: { label: o.probe.slice(0, 100), component: null },
    condition: { speed: 'idle', acClutch: 'unknown', electricalLoad: 'unknown', beltOff: false },
    phase: 'before',
    source: 'recording',
  };
}
