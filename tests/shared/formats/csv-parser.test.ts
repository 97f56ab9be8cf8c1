import { createReadStream, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { CaptureFormatError } from '../../../shared/formats/capture-format-error';
import { createCsvParser } from '../../../shared/formats/csv-parser';
import { parseCaptureStream } from '../../../shared/formats/parse-capture-stream';
import { type TimeUnit } from '../../../shared/formats/csv-layout';

const fixtures = path.resolve('tests/fixtures/captures');

function read(text: string, timeUnit: TimeUnit | null = null, chunk = 97) {
  const p = createCsvParser({ name: 'test.csv', timeUnit });
  const bytes = new TextEncoder().encode(text);
  for (let i = 0; i < bytes.length; i += chunk) p.feed(bytes.slice(i, i + chunk));
  return p.end();
}

function rows(n: number, dt: number, fmt: (t: number, i: number) => string): string {
  const out: string[] = [];
  for (let i = 0; i < n; i++) out.push(fmt(i * dt, i));
  return out.join('\n');
}

describe('CSV/TSV reader', () => {
  it('reads a scope export: preamble, unit row, ";" separators, decimal comma, time in ms (tests/fixtures/captures/held-820-scope.csv)', async () => {
    // A capture from the project's generator written in a bench scope's layout; see make-scope-csv.ts.
    const truth = JSON.parse(readFileSync(path.join(fixtures, 'held-820-scope.json'), 'utf8'));
    const cap = await parseCaptureStream(createReadStream(path.join(fixtures, 'held-820-scope.csv'), { highWaterMark: 4096 }), { name: 'held.csv' });
    expect(cap.sampleRateHz).toBeCloseTo(truth.sampleRateHz, 6);
    expect(cap.channels).toHaveLength(2);
    expect(cap.channels[0].length).toBe(truth.samples);
    expect(cap.channelNames).toEqual(['Ignition ref', 'Pickup']);
    expect(cap.channelUnits).toEqual(['V', 'V']);
    expect(cap.channels[1][0]).toBeCloseTo(truth.firstPickupV, 5);
  });

  it('reads comma CSV with a time_ms header', () => {
    const cap = read(`time_ms,ref,pickup\n${rows(2000, 0.1, (t, i) => `${t.toFixed(1)},${i % 7},${(i * 0.5).toFixed(1)}`)}`);
    expect(cap.sampleRateHz).toBeCloseTo(10_000, 6);
    expect(cap.channels[1][4]).toBe(2);
  });

  it('reads tab-separated values with decimal comma and a seconds header', () => {
    const cap = read(`Time (s)\tA\tB\n${rows(3000, 0.0001, (t) => `${t.toFixed(4).replace('.', ',')}\t1,5\t-2,25`)}`);
    expect(cap.sampleRateHz).toBeCloseTo(10_000, 6);
    expect(cap.channels[1][10]).toBe(-2.25);
  });

  it('takes the time unit from --time-unit when the header has none; read as seconds it says to add --time-unit ms', () => {
    const text = `t;a;b\n${rows(2000, 0.05, (t) => `${t.toFixed(2)};1;2`)}`;
    expect(read(text, 'ms').sampleRateHz).toBeCloseTo(20_000, 6);
    expect(() => read(text)).toThrow(/--time-unit ms/);
    const secs = read(`t;a;b\n${rows(2000, 0.0001, (t) => `${t.toFixed(4)};1;2`)}`);
    expect(secs.sampleRateHz).toBeCloseTo(10_000, 6);
    expect(secs.notes.join(' ')).toMatch(/read as seconds/);
  });

  it('takes the sample interval from the preamble when there is no time column', () => {
    const cap = read(`# sample interval;0,05;ms\nCH1;CH2\n${rows(2000, 1, (_t, i) => `${i};${-i}`)}`);
    expect(cap.sampleRateHz).toBeCloseTo(20_000, 6);
    expect(cap.channels).toHaveLength(2);
    expect(cap.channels[1][3]).toBe(-3);
  });

  it('accepts a time column printed to 2 decimals whose rounding exceeds half a sample', () => {
    // 30 kHz in ms: 0.0333… printed as 0.03/0.07/0.10 — off by up to 0.005 ms (0.15 sample), within the printed precision.
    const cap = read(`time_ms,a,b\n${rows(6000, 1 / 30, (t) => `${t.toFixed(2)},0,1`)}`);
    expect(cap.sampleRateHz).toBeCloseTo(30_000, 0);
  });

  const bad: [string, string, string][] = [
    ['not_a_number', `time,a,b\n${rows(100, 0.001, (t, i) => `${t},${i === 50 ? 'abc' : 1},2`)}`, 'line 52'],
    ['ragged_row', `time,a,b\n${rows(100, 0.001, (t, i) => (i === 60 ? `${t},1` : `${t},1,2`))}`, 'line 62'],
    ['non_finite', `time,a,b\n${rows(100, 0.001, (t, i) => `${t},${i === 70 ? 'NaN' : 1},2`)}`, 'line 72'],
    ['no_data', 'time,a,b\n', ''],
    ['rate_irregular', `time,a,b\n${rows(2000, 0.001, (t, i) => `${(i < 1000 ? t : t + 0.01).toFixed(3)},1,2`)}`, 'sample intervals'],
    ['rate_irregular', `time,a,b\n${rows(2000, 0.001, (t, i) => `${(t * (1 + i * 2e-5)).toFixed(6)},1,2`)}`, 'drifts'],
    ['rate_out_of_range', `time,a,b\n${rows(100, 0.01, (t) => `${t.toFixed(2)},1,2`)}`, '1 kHz'],
    ['zero_rate', `time,a,b\n${rows(100, 0, () => '0,1,2')}`, 'time column'],
  ];
  for (const [code, text, hint] of bad) {
    it(`refuses with code ${code}${hint ? ` (${hint})` : ''}`, () => {
      let err: unknown;
      try { read(text); } catch (e) { err = e; }
      expect(err).toBeInstanceOf(CaptureFormatError);
      expect((err as CaptureFormatError).code).toBe(code);
      expect((err as Error).message).toContain(hint);
      expect((err as Error).message).not.toContain('\n');
    });
  }

  it('refuses a file with only a time column (too_few_channels)', () => {
    expect(() => read(`time\n${rows(100, 0.001, (t) => `${t}`)}`)).toThrow(expect.objectContaining({ code: 'too_few_channels' }));
  });
});
