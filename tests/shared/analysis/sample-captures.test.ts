import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { runPipeline } from '../../../shared/analysis/pipeline';
import { resolveSettings } from '../../../shared/analysis/resolve-settings';
import { CaptureFormatError } from '../../../shared/formats/capture-format-error';
import { parseCaptureBytes } from '../../../shared/formats/parse-capture-stream';
import { rankCapture } from '../../../shared/ranking/rank-capture';
import { parseDriveDocument } from '../../../shared/schemas/drive';
import { encodeWav } from '../../../shared/synth/encode-wav';
import { generateCapture } from '../../../shared/synth/generate-capture';

// The checks the analyze contract makes on sample captures, run on the checkout's own files: a
// generator-made idle capture written as 16-bit WAV, a generator-made scope export in CSV
// (tests/fixtures/captures), and two published CWRU bearing recordings (tests/fixtures/open-data).
const fixtures = path.resolve('tests');
const demo = JSON.parse(readFileSync(path.join(fixtures, 'shared/drive/fixtures/demo-i4.drive.json'), 'utf8'));
const rig = parseDriveDocument(JSON.parse(readFileSync(path.join(fixtures, 'shared/drive/fixtures/test-rig.drive.json'), 'utf8')));
const engineFlags = { refChannel: 1, pickupChannel: 2, refPerCycle: 1, cylinders: 4, firingOrder: [1, 3, 4, 2] };

describe('generated idle capture like idle-i4.wav: 10 s, 48 kHz 16-bit, ~780 rpm ±2 %, alternator outer race at 8.736', () => {
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

describe('generated scope export held-820-scope.csv (preamble, unit row, ms, ";", decimal comma)', () => {
  const truth = JSON.parse(readFileSync(path.join(fixtures, 'fixtures/captures/held-820-scope.json'), 'utf8'));
  const capture = parseCaptureBytes(readFileSync(path.join(fixtures, 'fixtures/captures/held-820-scope.csv')), { name: 'held-820-scope.csv' });
  const r = runPipeline(capture, resolveSettings(engineFlags));

  it('mean rpm within 0.5 % of the generator truth', () => {
    expect(Math.abs(r.speed.meanRpm - truth.rpmMean) / truth.rpmMean).toBeLessThan(0.005);
  });

  it('the planted alternator outer-race order among the first 20 peaks', () => {
    const tol = Math.max(1.5 * r.orders.spectrum.resolution, 0.006 * truth.bearingOrder);
    expect([...r.orders.peaks.slice(0, 20), ...r.envelope.peaks.slice(0, 20)]
      .some((p) => Math.abs(p.order - truth.bearingOrder) <= tol)).toBe(true);
  });
});

// Published recordings: CWRU Bearing Data Center records 105 (inner race) and 130 (outer race),
// 12 kHz drive end, with a synthesised once-per-revolution pulse on channel 1 (see
// tests/fixtures/open-data/README.md). Defect orders from the data set's own table:
// BPFI 5.4152, BPFO 3.5848 × shaft speed. Analysed with --ref-per-cycle 2.
const openData = path.join(fixtures, 'fixtures/open-data');
const cwru = JSON.parse(readFileSync(path.join(openData, 'cwru.json'), 'utf8')) as Record<string, { rpm: number; component: string; fault: string; order: number }>;

describe.each(Object.entries(cwru))('%s (published CWRU recording)', (name, truth) => {
  const capture = parseCaptureBytes(readFileSync(path.join(openData, name)), { name });
  const settings = resolveSettings({ ...engineFlags, refPerCycle: 2 });
  const r = runPipeline(capture, settings, { drive: rig, rank: (inp) => rankCapture(rig, inp) });

  it(`mean rpm within 1 % of the record's ${truth.rpm} rpm`, () => {
    expect(Math.abs(r.speed.meanRpm - truth.rpm) / truth.rpm).toBeLessThan(0.01);
  });

  it('published defect order among the first 10 envelope peaks (within 1 %)', () => {
    expect(r.envelope.peaks.slice(0, 10).some((p) => Math.abs(p.order - truth.order) <= 0.01 * truth.order)).toBe(true);
  });

  it("with the rig's drive document, the faulty bearing and its fault ranked first", () => {
    expect(r.ranking[0]?.component).toBe(truth.component);
    expect(r.ranking[0]?.fault).toBe(truth.fault);
  });
});
