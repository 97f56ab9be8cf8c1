import { describe, expect, it } from 'vitest';
import { CaptureFormatError } from '../../../shared/formats/capture-format-error';
import { createCsvParser } from '../../../shared/formats/csv-parser';
import { type TimeUnit } from '../../../shared/formats/csv-cells';
import { parseCaptureBytes } from '../../../shared/formats/parse-capture-stream';

/**
 * The layouts bench scopes and data loggers write, each built here from strings with invented
 * values (no vendor file copied). Every file is fed in small odd-sized chunks so that line ends,
 * quotes and the BOM also cross chunk boundaries.
 */
function readBytes(bytes: Uint8Array, timeUnit: TimeUnit | null = null, chunk = 61) {
  const p = createCsvParser({ name: 'scope.csv', timeUnit });
  for (let i = 0; i < bytes.length; i += chunk) p.feed(bytes.slice(i, i + chunk));
  return p.end();
}
const read = (text: string, timeUnit: TimeUnit | null = null, chunk = 61) => readBytes(new TextEncoder().encode(text), timeUnit, chunk);

/** Two invented channels: a square-ish reference and a slow ramp, so values can be checked by index. */
const ref = (i: number) => (i % 40 < 4 ? 4.5 : 0.02);
const pick = (i: number) => Math.round((i % 250) * 0.004 * 1e4) / 1e4;
const N = 3000;

function lines(n: number, fmt: (i: number) => string): string[] {
  return Array.from({ length: n }, (_, i) => fmt(i));
}

function expectChannels(cap: ReturnType<typeof read>, n = N) {
  expect(cap.channels).toHaveLength(2);
  expect(cap.channels[0].length).toBe(n);
  for (const i of [0, 3, 4, 77, n - 1]) {
    expect(cap.channels[0][i]).toBeCloseTo(ref(i), 5);
    expect(cap.channels[1][i]).toBeCloseTo(pick(i), 4);
  }
}

describe('CSV layouts of bench scopes and loggers', () => {
  it('takes time from Start and Increment header columns over a sample-index column with empty trailing cells', () => {
    const text = ['X,CH1,CH2,Start,Increment', 'Sequence,Volt,Volt,-2.0e-02,5.0e-05',
      ...lines(N, (i) => `${i},${ref(i).toExponential(3)},${pick(i).toExponential(4)},,`)].join('\n');
    const cap = read(text);
    expect(cap.sampleRateHz).toBeCloseTo(20_000, 6);
    expect(cap.channelNames).toEqual(['CH1', 'CH2']);
    expect(cap.channelUnits).toEqual(['Volt', 'Volt']);
    expectChannels(cap);
  });

  it('takes Start and Increment from the first data row when there is no unit row', () => {
    const text = ['X,CH1,CH2,Start,Increment',
      ...lines(N, (i) => (i === 0 ? `0,${ref(0)},${pick(0)},-0.01,2e-05` : `${i},${ref(i)},${pick(i)}`))].join('\n');
    expect(read(text).sampleRateHz).toBeCloseTo(50_000, 6);
  });

  it('refuses a sample-index column with a missing stretch of samples (rate_irregular)', () => {
    const text = ['X,CH1,CH2,Start,Increment', 'Sequence,Volt,Volt,0,5.0e-05',
      ...lines(N, (i) => `${i < 1500 ? i : i + 3},${ref(i)},${pick(i)},,`)].join('\n');
    expect(() => read(text)).toThrow(expect.objectContaining({ code: 'rate_irregular' }));
  });

  it('reads time and two channels beside a key/value preamble in the first three columns', () => {
    const kv = [['Record Length', '3.000000e+03', 'Points'], ['Sample Interval', '5.000000e-05', 's'], ['Trigger Point', '4.000000e+02', 'Samples'],
      ['Source', 'CH1', ''], ['Vertical Units', 'V', ''], ['Horizontal Units', 's', '']];
    const text = lines(N, (i) => [...(kv[i] ?? ['', '', '']), (-0.02 + i * 5e-5).toFixed(6), ref(i).toFixed(3), pick(i).toFixed(4)].join(',') + ',').join('\r\n');
    const cap = read(text);
    expect(cap.sampleRateHz).toBeCloseTo(20_000, 4);
    expect(cap.notes.join(' ')).not.toMatch(/read as seconds/);
    expectChannels(cap);
  });

  it('reads a key/value preamble to the right of the data and infers ms from its interval', () => {
    const kv = [['Sample Interval', '2.5e-05'], ['Record Length', '3000']];
    const text = lines(N, (i) => [(i * 0.025).toFixed(3), ref(i), pick(i), '', ...(kv[i] ?? ['', ''])].join(';')).join('\n');
    const cap = read(text);
    expect(cap.sampleRateHz).toBeCloseTo(40_000, 4);
    expect(cap.notes.join(' ')).not.toMatch(/read as seconds/);
    expectChannels(cap);
  });

  it('reads quoted cells, a UTF-8 BOM and CRLF line ends', () => {
    const text = `\ufeff"Time (s)","Ignition","Pickup"\r\n${lines(N, (i) => `"${(i * 1e-4).toFixed(4)}","${ref(i)}","${pick(i)}"`).join('\r\n')}\r\n`;
    const cap = read(text);
    expect(cap.sampleRateHz).toBeCloseTo(10_000, 6);
    expect(cap.channelNames).toEqual(['Ignition', 'Pickup']);
    expectChannels(cap);
  });

  it('reads quoted decimal-comma cells in a comma-separated file', () => {
    const text = `Time,A,B\n${lines(N, (i) => `"${(i * 1e-4).toFixed(4).replace('.', ',')}","${String(ref(i)).replace('.', ',')}","${String(pick(i)).replace('.', ',')}"`).join('\n')}`;
    expectChannels(read(text));
  });

  it('reads CR-only line ends, whatever the chunk size', () => {
    const text = `time_ms,a,b\r${lines(N, (i) => `${(i * 0.05).toFixed(2)},${ref(i)},${pick(i)}`).join('\r')}\r`;
    for (const chunk of [1, 7, 4096]) {
      const cap = read(text, null, chunk);
      expect(cap.sampleRateHz).toBeCloseTo(20_000, 6);
      expectChannels(cap);
    }
  });

  it('ignores trailing separators and blank lines (also separator-only ones) at the end', () => {
    const text = `Time;A;B;\n${lines(N, (i) => `${(i * 2e-5).toExponential(3)};${ref(i)};${pick(i)};`).join('\n')}\n\n;;;\n\n`;
    const cap = read(text);
    expect(cap.sampleRateHz).toBeCloseTo(50_000, 6);
    expectChannels(cap);
  });

  it('reads scientific notation with a decimal comma (1,5E-03) and a unit row (ms);(V);(V)', () => {
    const sci = (v: number) => v.toExponential(4).replace('.', ',').replace('e', 'E');
    const text = `Time;Ref;Pickup\n(ms);(V);(V)\n${lines(N, (i) => `${sci(i * 0.02)};${sci(ref(i))};${sci(pick(i))}`).join('\n')}`;
    const cap = read(text);
    expect(cap.sampleRateHz).toBeCloseTo(50_000, 4);
    expect(cap.channelUnits).toEqual(['V', 'V']);
    expectChannels(cap);
  });

  it('reads a bare unit row s,V,V under the header', () => {
    const text = `Time,Ref,Pickup\ns,V,V\n${lines(N, (i) => `${(i * 1e-4).toFixed(4)},${ref(i)},${pick(i)}`).join('\n')}`;
    const cap = read(text);
    expect(cap.sampleRateHz).toBeCloseTo(10_000, 6);
    expect(cap.channelUnits).toEqual(['V', 'V']);
    expect(cap.notes.join(' ')).not.toMatch(/read as seconds/);
  });

  it('reads a lone unit row (ms,V,V) with no names above it', () => {
    const text = `ms,V,V\n${lines(N, (i) => `${(i * 0.1).toFixed(1)},${ref(i)},${pick(i)}`).join('\n')}`;
    const cap = read(text);
    expect(cap.sampleRateHz).toBeCloseTo(10_000, 6);
    expect(cap.channelNames).toEqual(['channel 1', 'channel 2']);
  });

  for (const [header, dt, fs] of [['Time (us)', 20, 50_000], ['Time [µs]', 5, 200_000], ['time_us', 1, 1_000_000], ['t[s]', 1e-4, 10_000], ['Time (ms)', 0.05, 20_000], ['time_ms', 0.2, 5000]] as const) {
    it(`takes the time unit from a header named ${header}`, () => {
      const text = `${header}\tCH A (V)\tCH B (g)\n${lines(N, (i) => `${+(i * dt).toPrecision(12)}\t${ref(i)}\t${pick(i)}`).join('\n')}`;
      const cap = read(text);
      expect(cap.sampleRateHz).toBeCloseTo(fs, 3);
      expect(cap.channelUnits).toEqual(['V', 'g']);
      expectChannels(cap);
    });
  }

  it('takes µs from a unit row written (µs)', () => {
    const text = `Time;A;B\n(µs);(V);(V)\n${lines(N, (i) => `${i * 10};${ref(i)};${pick(i)}`).join('\n')}`;
    expect(read(text).sampleRateHz).toBeCloseTo(100_000, 6);
  });

  it('reads a tab-separated logger export with a free-text preamble and a "Sampling rate" line', () => {
    const text = `Logger export\nSampling rate: 25 kHz\n\nSample\tch0\tch1\n${lines(N, (i) => `${i + 1}\t${ref(i)}\t${pick(i)}`).join('\n')}`;
    const cap = read(text);
    expect(cap.sampleRateHz).toBeCloseTo(25_000, 6);
    expect(cap.channelNames).toEqual(['ch0', 'ch1']);
    expectChannels(cap);
  });

  it('skips a sample-number column before a time column', () => {
    const text = `No.,Time(s),A,B\n${lines(N, (i) => `${i + 1},${(i * 1e-4).toFixed(4)},${ref(i)},${pick(i)}`).join('\n')}`;
    const cap = read(text);
    expect(cap.sampleRateHz).toBeCloseTo(10_000, 6);
    expectChannels(cap);
  });

  it('refuses a sample index without any interval (bad_header) and says what to add', () => {
    const text = `X,CH1,CH2\nSequence,Volt,Volt\n${lines(N, (i) => `${i},${ref(i)},${pick(i)}`).join('\n')}`;
    let err: unknown;
    try { read(text); } catch (e) { err = e; }
    expect(err).toBeInstanceOf(CaptureFormatError);
    expect((err as CaptureFormatError).code).toBe('bad_header');
    expect((err as Error).message).toMatch(/interval/);
  });

  it('still reports text in a data cell with its line number in a key/value layout', () => {
    const text = lines(N, (i) => [i === 0 ? 'Sample Interval' : '', i === 0 ? '5e-05' : '', '', (i * 5e-5).toFixed(6), i === 900 ? 'over' : ref(i), pick(i)].join(',')).join('\n');
    expect(() => read(text)).toThrow(/line 901/);
  });

  it('reads a UTF-16LE export with its byte-order mark (chosen by parseCaptureBytes too)', () => {
    const text = `\ufeffTime (s)\tA\tB\r\n${lines(N, (i) => `${(i * 1e-4).toFixed(4)}\t${ref(i)}\t${pick(i)}`).join('\r\n')}`;
    const bytes = new Uint8Array(text.length * 2);
    for (let i = 0; i < text.length; i++) { bytes[2 * i] = text.charCodeAt(i) & 255; bytes[2 * i + 1] = text.charCodeAt(i) >> 8; }
    expectChannels(readBytes(bytes));
    const cap = parseCaptureBytes(bytes, { name: 'logger.txt' });
    expect(cap.sampleRateHz).toBeCloseTo(10_000, 6);
  });

  it('refuses the 9.9E+37 over-range marker as non_finite with its line', () => {
    const text = `Time,A,B\n${lines(N, (i) => `${(i * 1e-4).toFixed(4)},${i === 1234 ? '9.9E+37' : ref(i)},${pick(i)}`).join('\n')}`;
    let err: unknown;
    try { read(text); } catch (e) { err = e; }
    expect((err as CaptureFormatError).code).toBe('non_finite');
    expect((err as Error).message).toMatch(/line 1236/);
  });

  it('reads a rate with its unit glued on (Sampling Rate,500kSa/s) above a channels-only header', () => {
    const text = `Sampling Rate,500kSa/s\nCH1,CH2\n${lines(N, (i) => `${ref(i)},${pick(i)}`).join('\n')}`;
    const cap = read(text);
    expect(cap.sampleRateHz).toBeCloseTo(500_000, 3);
    expect(cap.channelNames).toEqual(['CH1', 'CH2']);
    expectChannels(cap);
  });

  it('accepts a time column in scientific notation with 5 significant digits (rounding above half a sample late in the record)', () => {
    // 50 kHz over 3 s: 2.99998E+00 needs 6 digits; printed with 5 the rounding reaches 5e-5 s = 2.5 samples.
    const n = 150_000;
    const text = `Time,A,B\n${Array.from({ length: n }, (_, i) => `${(i * 2e-5).toExponential(4)},${ref(i)},${pick(i)}`).join('\n')}`;
    const cap = read(text, null, 65536);
    expect(cap.sampleRateHz).toBeCloseTo(50_000, 0);
    expect(cap.channels[0].length).toBe(n);
  });
});
