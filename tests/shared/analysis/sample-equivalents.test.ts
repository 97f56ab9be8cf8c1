import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runPipeline } from '../../../shared/analysis/pipeline';
import { resolveSettings } from '../../../shared/analysis/resolve-settings';
import { CaptureFormatError } from '../../../shared/formats/capture-format-error';
import { parseCaptureBytes } from '../../../shared/formats/parse-capture-stream';
import { rankCapture } from '../../../shared/ranking/rank-capture';
import { parseDriveDocument } from '../../../shared/schemas/drive';
import { encodeWav } from '../../../shared/synth/encode-wav';
import { generateCapture } from '../../../shared/synth/generate-capture';

// ../shared/tools/check-analyze.mjs names WAV samples that the team kit does not ship
// (idle-i4.wav, cwru-105-inner-race.wav, cwru-130-outer-race.wav; see ../shared/samples/README.md).
// These are equivalents made with the project's generator to the samples' description, written
// as WAV and read back through the WAV reader, checked for the same properties as the tool.
const samples = '/work/shared/samples';
const demo = JSON.parse(readFileSync(`${samples}/demo-i4.drive.json`, 'utf8'));
const rig = parseDriveDocument(JSON.parse(readFileSync(`${samples}/test-rig.drive.json`, 'utf8')));
const engineFlags = { refChannel: 1, pickupChannel: 2, refPerCycle: 1, cylinders: 4, firingOrder: [1, 3, 4, 2] };

describe('idle-i4.wav equivalent: 10 s, 48 kHz 16-bit, ~780 rpm ±2 %, alternator outer race at 8.736', () => {
  const g = generateCapture({
    drive: demo, seed: 7, durationS: 10, sampleRateHz: 48_000, rpm: 780, wanderPct: 2, refKind: 'cyl1',
    fault: { component: 'Alternator', fault: 'outer_race' }, creepPct: 0, rollingSlipPct: 0, resonanceHz: 4000, snrDb: 6,
    injectorTicks: [{ cylinder: 1, angleDeg: 400, amplitude: 0.3 }, { cylinder: 3, angleDeg: 580, amplitude: 0.3 },
      { cylinder: 4, angleDeg: 40, amplitude: 0.3 }, { cylinder: 2, angleDeg: 220, amplitude: 0.9 }],
  });
  const wav = encodeWav(g.channels, 48_000, 'pcm16');
  const r = runPipeline(parseCaptureBytes(wav, { name: 'idle-i4.wav' }), resolveSettings(engineFlags));

  it('mean rpm within 0.5 %', () => {
    expect(Math.abs(r.speed.meanRpm - g.truth.rpm.mean) / g.truth.rpm.mean).toBeLessThan(0.005);
  });

  it('bearing order 8.736 among the first 20 peaks', () => {
    const tol = Math.max(1.5 * r.orders.spectrum.resolution, 0.006 * 8.736);
    expect([...r.orders.peaks.slice(0, 20), ...r.envelope.peaks.slice(0, 20)].some((p) => Math.abs(p.order - 8.736) <= tol)).toBe(true);
  });

  it('firing order 2 listed with engineOrder 2 and firing true', () => {
    const f = r.orders.peaks.find((p) => Math.abs(p.order - 2) < 0.05);
    expect(f?.engineOrder).toBe(2);
    expect(f?.firing).toBe(true);
  });

  it("injector tick in cylinder 3's slot near 220°", () => {
    expect(r.cycle.phaseResolved).toBe(true);
    expect(r.cycle.event?.cylinder).toBe(3);
    expect(Math.abs(r.cycle.event!.angleDeg - 220)).toBeLessThanOrEqual(15);
  });

  it('a truncated copy (first 60 bytes) is refused with code truncated', () => {
    expect(() => parseCaptureBytes(wav.subarray(0, 60), { name: 'truncated.wav' })).toThrow(CaptureFormatError);
    expect(() => parseCaptureBytes(wav.subarray(0, 60), { name: 'truncated.wav' })).toThrow(expect.objectContaining({ code: 'truncated' }));
  });
});

// CWRU Bearing Data Center records (published table: BPFI 5.4152, BPFO 3.5848 × shaft speed):
// 12 kHz float32, a once-per-revolution pulse on channel 1, analysed with --ref-per-cycle 2.
describe.each([
  ['cwru-105-inner-race.wav', 'inner_race', 1797, 5.4152],
  ['cwru-130-outer-race.wav', 'outer_race', 1796, 3.5848],
] as const)('%s equivalent (12 kHz, once-per-revolution reference)', (name, fault, rpm, order) => {
  const g = generateCapture({
    drive: rig, seed: rpm, durationS: 10, sampleRateHz: 12_000, rpm, wanderPct: 0.2, refPerCycle: 2, ringing: false,
    fault: { component: 'Drive-end bearing', fault }, creepPct: 0, rollingSlipPct: 0, resonanceHz: 3200, snrDb: 0, engineLevel: 0.2,
  });
  const capture = parseCaptureBytes(encodeWav(g.channels, 12_000, 'float32'), { name });
  const settings = resolveSettings({ ...engineFlags, refPerCycle: 2 });

  it(`published order ${order} among the first 10 envelope peaks (within 1 %)`, () => {
    const r = runPipeline(capture, settings);
    expect(r.envelope.peaks.slice(0, 10).some((p) => Math.abs(p.order - order) <= 0.01 * order)).toBe(true);
  });

  it(`with the rig's drive document, Drive-end bearing / ${fault} ranked first`, () => {
    const r = runPipeline(capture, settings, { drive: rig, rank: (inp) => rankCapture(rig, inp) });
    expect(r.ranking[0]?.component).toBe('Drive-end bearing');
    expect(r.ranking[0]?.fault).toBe(fault);
  });
});
