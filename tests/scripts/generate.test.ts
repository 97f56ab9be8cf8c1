import { afterAll, describe, expect, it, vi } from 'vitest';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { main, parseGenerateArgs, UsageError } from '../../scripts/generate';
import { parseCaptureBytes } from '../../shared/formats/parse-capture-stream';
import type { CaptureTruth } from '../../shared/synth/truth';

const drivePath = join(__dirname, '../fixtures/drives/fixture-i4-petrol.json');
const dir = mkdtempSync(join(tmpdir(), 'crankwise-generate-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function quietly<T>(run: () => T): { result: T; stderr: string } {
  let stderr = '';
  const err = vi.spyOn(process.stderr, 'write').mockImplementation((chunk) => { stderr += String(chunk); return true; });
  const out = vi.spyOn(process.stdout, 'write').mockImplementation(() => true);
  try {
    return { result: run(), stderr };
  } finally {
    err.mockRestore();
    out.mockRestore();
  }
}

describe('generate flags', () => {
  it('maps flags to generator options', () => {
    const request = parseGenerateArgs(['--drive', drivePath, '--out', 'x.csv', '--seed', '9', '--rpm', '900', '--ref-kind', 'wheel', '--wheel', '36-1',
      '--tdc-offset-deg', '-12', '--cam', '--fault-component', 'Alternator', '--fault', 'outer_race', '--creep-pct', '2', '--snr-db', '-3', '--distractor', 'clunk']);
    expect(request.format).toBe('csv');
    expect(request.options).toEqual({
      seed: 9, rpm: 900, refKind: 'wheel', wheel: '36-1', tdcOffsetDeg: -12, camChannel: true,
      fault: { component: 'Alternator', fault: 'outer_race', amplitude: null }, creepPct: 2, snrDb: -3, distractor: { kind: 'clunk' },
    });
  });

  it('reads repeated --tick flags and a speed ramp', () => {
    const request = parseGenerateArgs(['--drive', drivePath, '--out', 'x.wav', '--tick', '2:220:0.9', '--tick', '1:40:0.2', '--rpm-end', '2400']);
    expect(request.options.injectorTicks).toEqual([{ cylinder: 2, angleDeg: 220, amplitude: 0.9 }, { cylinder: 1, angleDeg: 40, amplitude: 0.2 }]);
    expect(request.options.rpmEnd).toBe(2400);
  });

  it.each([
    [['--drive', drivePath, '--out', 'x.wav', '--tick', '2:900:1'], /--tick must be/],
    [['--out', 'x.wav'], /--drive/],
    [['--drive', drivePath], /--out/],
    [['--drive', drivePath, '--out', 'x.wav', '--rpm', 'fast'], /--rpm must be a number/],
    [['--drive', drivePath, '--out', 'x.wav', '--seed', '1.5'], /--seed must be a whole number/],
    [['--drive', drivePath, '--out', 'x.wav', '--ref-kind', 'coil'], /--ref-kind must be one of/],
    [['--drive', drivePath, '--out', 'x.wav', '--fault', 'shaft'], /--fault-component and --fault go together/],
    [['--drive', drivePath, '--out', 'x.wav', '--format', 'csv'], /\.wav but --format is csv/],
    [['--drive', drivePath, '--out', 'x.wav', '--frobnicate'], /frobnicate/],
  ])('refuses %o naming the problem', (argv, message) => {
    expect(() => parseGenerateArgs(argv)).toThrow(UsageError);
    expect(() => parseGenerateArgs(argv)).toThrow(message);
  });
});

describe('generate command', () => {
  it('writes a 16-bit WAV and its truth beside it; the scales restore pickup units', () => {
    const out = join(dir, 'idle.wav');
    const { result } = quietly(() => main(['--drive', drivePath, '--out', out, '--duration-s', '1', '--sample-rate', '16000', '--cam',
      '--fault-component', 'Water pump', '--fault', 'inner_race']));
    expect(result).toBe(0);
    const capture = parseCaptureBytes(readFileSync(out), { name: 'idle.wav' });
    const truth = JSON.parse(readFileSync(join(dir, 'idle.json'), 'utf8')) as CaptureTruth;
    expect(capture.sampleRateHz).toBe(16000);
    expect(capture.channels).toHaveLength(3);
    expect(truth.channels).toEqual(['reference', 'pickup', 'cam']);
    expect(truth.fault).toMatchObject({ component: 'Water pump', fault: 'inner_race' });
    expect(truth.snr.definition).toMatch(/P_fault/);
    // Each channel was scaled to 0.9 of full scale; the recorded scale undoes it.
    for (let c = 0; c < 3; c++) {
      let peak = 0;
      for (const v of capture.channels[c]) peak = Math.max(peak, Math.abs(v));
      expect(peak).toBeCloseTo(0.9, 3);
      expect(truth.channelScale[c]).toBeGreaterThan(0);
    }
  });

  it('writes a CSV in milliseconds into a directory, named after the drive and seed', () => {
    const { result } = quietly(() => main(['--drive', drivePath, '--out', dir, '--format', 'csv-ms', '--preamble', '--duration-s', '1', '--sample-rate', '10000', '--seed', '5']));
    expect(result).toBe(0);
    const file = join(dir, 'fixture-i4-petrol-invented-seed5.csv');
    const capture = parseCaptureBytes(readFileSync(file), { name: 'x.csv' });
    expect(capture.sampleRateHz).toBeCloseTo(10000, 2);
    expect(JSON.parse(readFileSync(join(dir, 'fixture-i4-petrol-invented-seed5.json'), 'utf8')).seed).toBe(5);
  });

  it('answers bad input with exit code 2 and one line on stderr', () => {
    const { result, stderr } = quietly(() => main(['--drive', drivePath, '--out', dir, '--fault-component', 'Flux capacitor', '--fault', 'shaft']));
    expect(result).toBe(2);
    expect(stderr.trim().split('\n')).toHaveLength(1);
    expect(stderr).toMatch(/Flux capacitor/);
    const missing = quietly(() => main(['--drive', join(dir, 'nope.json'), '--out', dir]));
    expect(missing.result).toBe(2);
    expect(missing.stderr).toMatch(/cannot read the drive document/);
    const badRpm = quietly(() => main(['--drive', drivePath, '--out', dir, '--rpm', '50']));
    expect(badRpm.result).toBe(2);
    expect(badRpm.stderr).toMatch(/^generate: --rpm:/);
  });

  it('exits 2 as a whole process for an unknown flag', () => {
    const run = spawnSync(process.execPath, ['--import', 'tsx', join(__dirname, '../../scripts/generate.ts'), '--drive', drivePath, '--out', dir, '--bogus'], { encoding: 'utf8' });
    expect(run.status).toBe(2);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
    expect(run.stderr).toMatch(/bogus/);
  }, 30_000);
});
