// The hostile and malformed captures of tests/fixtures/bad/ (issue 19 item 6) through the BUILT
// worker entry the job runner's pool runs, all in ONE child process: each file ends in its typed
// code (tests/fixtures/bad/README.md), the process survives every file, and its memory stays
// bounded (peak resident memory read from the child, not from the test runner). Needs the build
// (`npm test` builds first).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { projectRoot } from '../../../server/paths';
import { buildBadCapture } from '../../fixtures/bad/make-bad-captures';

const root = projectRoot();
const dir = join(root, 'tests', 'fixtures', 'bad');
const scratch = mkdtempSync(join(tmpdir(), 'crankwise-bad-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

/** Expected code per file (null = analysed); the same table as the fixtures' README. */
const EXPECTED: Record<string, string | null> = {
  'empty.wav': 'no_data', 'empty.csv': 'no_data', 'riff-only.wav': 'truncated',
  'header-cut-at-20-bytes.wav': 'truncated', 'header-cut-inside-fmt.wav': 'truncated', 'ends-before-data.wav': 'truncated',
  'data-truncated.wav': 'truncated', 'claims-2e31-samples.wav': 'truncated', 'chunk-size-past-end.wav': 'truncated',
  'fmt-size-4-gb.wav': 'truncated', 'fmt-too-short.wav': 'bad_header', 'block-align-mismatch.wav': 'bad_header',
  'data-before-fmt.wav': 'bad_header', 'zero-sample-rate.wav': 'zero_rate', 'zero-channels.wav': 'unsupported_encoding',
  'nine-channels.wav': 'unsupported_encoding', 'adpcm-encoding.wav': 'unsupported_encoding', 'rf64-header.wav': 'unsupported_encoding',
  'rate-500-hz.wav': 'rate_out_of_range', 'zip-renamed.wav': 'bad_magic', 'zip-renamed.csv': 'unknown_format',
  'png-renamed.csv': 'unknown_format', 'binary-garbage.csv': 'unknown_format', 'text-in-number-column.csv': 'not_a_number',
  'ragged-rows.csv': 'ragged_row', 'million-columns.csv': 'bad_header', 'non-uniform-time.csv': 'rate_irregular',
  'time-stands-still.csv': 'zero_rate', 'only-a-time-column.csv': 'too_few_channels', 'one-data-row.csv': 'no_data',
  'over-range-marker.csv': 'non_finite', 'nan-in-float-wav.wav': 'non_finite',
  'all-zero-channels.wav': 'flat_channel', 'pickup-clipped-flat.wav': 'flat_channel',
  'reference-without-pulses.wav': 'no_reference', 'reference-at-30000-rpm.wav': 'speed_implausible',
  'valid-capture.wav': null,
};

/** Peak resident memory the child may reach (MB): Node itself is about 50–70 MB; the bug's WAV header alone reserved 8 GB. */
const PEAK_RSS_MB = 400;

describe('hostile captures through the worker entry, in a child process', () => {
  it('keeps at least 30 files in the two tiers', () => {
    const kept = readdirSync(dir).filter((f) => /\.(wav|csv)$/.test(f));
    expect(kept.length + 1).toBeGreaterThanOrEqual(30);
    expect(new Set([...kept, 'million-columns.csv'])).toEqual(new Set(Object.keys(EXPECTED)));
  });

  it('ends each file in its stable code, survives all of them and stays within its memory bound', () => {
    const entry = join(root, 'dist', 'node', 'workers', 'analysis.js');
    if (!existsSync(entry)) throw new Error(`${entry} is missing: run npm run build:node (npm test builds first)`);
    const wide = join(scratch, 'million-columns.csv');
    writeFileSync(wide, buildBadCapture('million-columns.csv'));
    const files = Object.keys(EXPECTED).map((f) => (f === 'million-columns.csv' ? wide : join(dir, f)));
    const child = spawnSync(process.execPath, [join(root, 'tests', 'helpers', 'analyze-in-child.mjs'), root, ...files], { encoding: 'utf8', maxBuffer: 16 << 20 });
    expect(child.status, child.stderr).toBe(0);
    const lines = child.stdout.trim().split('\n').map((l) => JSON.parse(l) as { file?: string; ok?: boolean; code?: string | null; message?: string; rssMb?: number; peakRssMb?: number });
    const peak = lines.pop()!;
    const outcomes = Object.fromEntries(lines.map((l) => [l.file!, l.code ?? null]));
    expect(outcomes).toEqual(EXPECTED);
    for (const l of lines) if (!l.ok) expect(l.message!.length, l.file).toBeGreaterThan(20);
    expect(peak.peakRssMb).toBeLessThan(PEAK_RSS_MB);
  });
});
