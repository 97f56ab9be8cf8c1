// Fuzzing the capture readers (issue 19 item 6): random bytes, and valid WAV and CSV captures with
// random damage, must end in a capture or a typed CaptureFormatError — never another exception, a
// crash or a hang — and a capture never holds more samples than the file had bytes. fast-check
// with a fixed seed and bounded runs, so every run checks the same inputs (a failure prints its
// counterexample and seed). Technique: mutation-based fuzzing (common practice).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CaptureFormatError } from '../../../shared/formats/capture-format-error';
import { createCaptureParser, parseCaptureBytes } from '../../../shared/formats/parse-capture-stream';
import type { Capture } from '../../../shared/formats/capture';

const SEED = 19;

/** parseCaptureBytes, with anything but a CaptureFormatError rethrown (fails the property). */
function outcome(bytes: Uint8Array, name: string): Capture | CaptureFormatError {
  try {
    return parseCaptureBytes(bytes, { name });
  } catch (error) {
    if (error instanceof CaptureFormatError) return error;
    throw error;
  }
}

/** The same through the streaming reader, fed in chunks of the given sizes. */
function chunkedOutcome(bytes: Uint8Array, name: string, sizes: number[]): Capture | CaptureFormatError {
  try {
    if (bytes.length === 0) return parseCaptureBytes(bytes, { name });
    const parser = createCaptureParser(bytes.subarray(0, 4), { name });
    let at = 0;
    for (let k = 0; at < bytes.length; k++) {
      const size = sizes.length ? sizes[k % sizes.length]! : bytes.length;
      parser.feed(bytes.slice(at, at + size));
      at += size;
    }
    return parser.end();
  } catch (error) {
    if (error instanceof CaptureFormatError) return error;
    throw error;
  }
}

function checkBounded(result: Capture | CaptureFormatError, bytes: Uint8Array): void {
  if (result instanceof CaptureFormatError) {
    expect(result.code).toMatch(/^[a-z_]+$/);
    expect(result.message.length).toBeGreaterThan(10);
    return;
  }
  const samples = result.channels.reduce((n, ch) => n + ch.length, 0);
  expect(samples).toBeLessThanOrEqual(bytes.length);
  expect(result.sampleRateHz).toBeGreaterThanOrEqual(1000);
  expect(result.sampleRateHz).toBeLessThanOrEqual(1_000_000);
  for (const ch of result.channels) for (const v of ch) if (!Number.isFinite(v)) throw new Error('non-finite sample in a capture');
}

/** A valid 16-bit PCM WAV (RIFF layout per the Microsoft RIFF/WAVE specification, 1991). */
function validWav(frames = 1500, channels = 2, rate = 8000): Uint8Array {
  const dataLen = frames * channels * 2;
  const b = new Uint8Array(44 + dataLen);
  const v = new DataView(b.buffer);
  const put = (off: number, s: string) => { for (let i = 0; i < s.length; i++) b[off + i] = s.charCodeAt(i); };
  put(0, 'RIFF'); v.setUint32(4, 36 + dataLen, true); put(8, 'WAVE');
  put(12, 'fmt '); v.setUint32(16, 16, true); v.setUint16(20, 1, true); v.setUint16(22, channels, true);
  v.setUint32(24, rate, true); v.setUint32(28, rate * channels * 2, true); v.setUint16(32, channels * 2, true); v.setUint16(34, 16, true);
  put(36, 'data'); v.setUint32(40, dataLen, true);
  for (let i = 0; i < frames * channels; i++) v.setInt16(44 + 2 * i, Math.round(8000 * Math.sin(i / 7)), true);
  return b;
}

/** A valid CSV export: time in seconds at 10 kHz, two channels. */
function validCsv(rows = 1200): string {
  const lines = ['Time (s),Reference (V),Pickup (g)'];
  for (let i = 0; i < rows; i++) lines.push(`${(i / 10_000).toFixed(4)},${(i % 40 === 0 ? 4.8 : 0.1).toFixed(3)},${Math.sin(i / 5).toFixed(5)}`);
  return `${lines.join('\n')}\n`;
}

const edgeUint32 = fc.oneof(fc.constantFrom(0, 1, 2, 3, 15, 16, 17, 40, 0x7fffffff, 0x80000000, 0xfffffffe, 0xffffffff), fc.nat({ max: 0xffffffff }));
const edgeUint16 = fc.oneof(fc.constantFrom(0, 1, 2, 3, 8, 9, 16, 24, 32, 64, 0xfffe, 0xffff), fc.nat({ max: 0xffff }));

/** A damaging edit of a byte string: overwrite bytes, set a header field, truncate, or insert. */
const byteEdit = fc.oneof(
  fc.record({ kind: fc.constant('byte' as const), at: fc.nat(), value: fc.nat({ max: 255 }) }),
  fc.record({ kind: fc.constant('u32' as const), at: fc.constantFrom(4, 16, 24, 28, 40), value: edgeUint32 }),
  fc.record({ kind: fc.constant('u16' as const), at: fc.constantFrom(20, 22, 32, 34), value: edgeUint16 }),
  fc.record({ kind: fc.constant('truncate' as const), at: fc.nat() }),
  fc.record({ kind: fc.constant('insert' as const), at: fc.nat(), bytes: fc.uint8Array({ minLength: 1, maxLength: 16 }) }),
);
type ByteEdit = typeof byteEdit extends fc.Arbitrary<infer T> ? T : never;

function applyEdits(source: Uint8Array, edits: ByteEdit[]): Uint8Array {
  let b = source.slice();
  for (const e of edits) {
    if (b.length === 0) break;
    const at = e.at % b.length;
    const v = new DataView(b.buffer, b.byteOffset, b.length);
    if (e.kind === 'byte') b[at] = e.value;
    else if (e.kind === 'u32' && e.at + 4 <= b.length) v.setUint32(e.at, e.value, true);
    else if (e.kind === 'u16' && e.at + 2 <= b.length) v.setUint16(e.at, e.value, true);
    else if (e.kind === 'truncate') b = b.slice(0, at);
    else if (e.kind === 'insert') {
      const next = new Uint8Array(b.length + e.bytes.length);
      next.set(b.subarray(0, at));
      next.set(e.bytes, at);
      next.set(b.subarray(at), at + e.bytes.length);
      b = next;
    }
  }
  return b;
}

/** A damaging edit of CSV text: a random string in place of a slice, a dropped or repeated line, another separator. */
const textEdit = fc.oneof(
  fc.record({ kind: fc.constant('splice' as const), at: fc.nat(), drop: fc.nat({ max: 40 }), text: fc.oneof(fc.string({ maxLength: 12 }), fc.constantFrom('NaN', 'inf', '-', ',', ';', '\t', '\n', '\r', '"', '1e309', '9.9E37', '0x10', '١٢', '\u0000', 'abc', ',,,,,,')) }),
  fc.record({ kind: fc.constant('line' as const), at: fc.nat(), repeat: fc.boolean() }),
  fc.record({ kind: fc.constant('separator' as const), to: fc.constantFrom(';', '\t', ' ', '|') }),
);
type TextEdit = typeof textEdit extends fc.Arbitrary<infer T> ? T : never;

function applyTextEdits(source: string, edits: TextEdit[]): string {
  let s = source;
  for (const e of edits) {
    if (e.kind === 'splice') {
      const at = s.length ? e.at % s.length : 0;
      s = s.slice(0, at) + e.text + s.slice(at + e.drop);
    } else if (e.kind === 'line') {
      const lines = s.split('\n');
      const at = e.at % lines.length;
      if (e.repeat) lines.splice(at, 0, lines[at]!);
      else lines.splice(at, 1);
      s = lines.join('\n');
    } else s = s.split(',').join(e.to);
  }
  return s;
}

describe('capture readers under random and damaged input', { timeout: 60_000 }, () => {
  it('random bytes, named .wav or .csv: a capture or a typed error', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 3000 }), fc.constantFrom('x.wav', 'x.csv', 'x'), (bytes, name) => {
        checkBounded(outcome(bytes, name), bytes);
      }),
      { seed: SEED, numRuns: 400 },
    );
  });

  it('random bytes behind a RIFF/WAVE/fmt header: a capture or a typed error', () => {
    const header = validWav(0).subarray(0, 36);
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 2000 }), (tail) => {
        const bytes = new Uint8Array(header.length + tail.length);
        bytes.set(header);
        bytes.set(tail, header.length);
        checkBounded(outcome(bytes, 'x.wav'), bytes);
      }),
      { seed: SEED, numRuns: 300 },
    );
  });

  it('a valid WAV with damaged bytes, header fields, truncation or insertions: typed errors, the same result in any chunking', () => {
    const wav = validWav();
    expect(outcome(wav, 'ok.wav')).not.toBeInstanceOf(CaptureFormatError);
    fc.assert(
      fc.property(fc.array(byteEdit, { minLength: 1, maxLength: 6 }), fc.array(fc.integer({ min: 1, max: 700 }), { maxLength: 4 }), (edits, sizes) => {
        const bytes = applyEdits(wav, edits);
        const whole = outcome(bytes, 'x.wav');
        checkBounded(whole, bytes);
        const chunked = chunkedOutcome(bytes, 'x.wav', sizes);
        if (whole instanceof CaptureFormatError) expect(chunked instanceof CaptureFormatError ? chunked.code : 'capture').toBe(whole.code);
        else expect(chunked instanceof CaptureFormatError ? chunked.code : chunked.channels[0]!.length).toBe(whole.channels[0]!.length);
      }),
      { seed: SEED, numRuns: 400 },
    );
  });

  it('a valid CSV with damaged text, dropped or repeated lines, or another separator: a capture or a typed error', () => {
    const csv = validCsv();
    expect(outcome(new TextEncoder().encode(csv), 'ok.csv')).not.toBeInstanceOf(CaptureFormatError);
    fc.assert(
      fc.property(fc.array(textEdit, { minLength: 1, maxLength: 5 }), fc.array(fc.integer({ min: 1, max: 5000 }), { maxLength: 3 }), (edits, sizes) => {
        const bytes = new TextEncoder().encode(applyTextEdits(csv, edits));
        checkBounded(outcome(bytes, 'x.csv'), bytes);
        checkBounded(chunkedOutcome(bytes, 'x.csv', sizes), bytes);
      }),
      { seed: SEED, numRuns: 300 },
    );
  });

  it('headers claiming up to 2^32 bytes of samples cost no memory before the samples arrive', () => {
    // Before the fix the reader allocated the claimed length up front: 17 GB of Float32Array for
    // an 8-bit mono header claiming 0xFFFFFFFE bytes (RangeError or an out-of-memory kill).
    fc.assert(
      fc.property(edgeUint32, fc.constantFrom(8, 16, 24, 32), fc.integer({ min: 1, max: 8 }), (size, bits, channels) => {
        const b = validWav(10, 1, 8000).slice(0, 44);
        const v = new DataView(b.buffer);
        v.setUint16(22, channels, true);
        v.setUint16(32, (channels * bits) / 8, true);
        v.setUint16(34, bits, true);
        v.setUint32(40, size, true);
        const before = process.memoryUsage().arrayBuffers;
        const result = outcome(b, 'claim.wav');
        // 8 channels × 2^21 frames × 4 bytes = 64 MiB is the most a header can make the reader
        // reserve; the bound leaves room for buffers the runtime allocates meanwhile (the bug reserved 8–17 GB).
        expect(process.memoryUsage().arrayBuffers - before).toBeLessThan(256 * 2 ** 20);
        checkBounded(result, b);
      }),
      { seed: SEED, numRuns: 60 },
    );
  });
});

describe('very wide CSV', { timeout: 60_000 }, () => {
  // Before the width check, layout detection was quadratic in the fields per line: 3 rows of
  // 200 000 numbers ran for minutes, and each channel column reserved 256 KiB.
  it.each([
    ['a header of a million columns', () => `${Array.from({ length: 1_000_000 }, (_, i) => `c${i}`).join(',')}\n0,1,2\n0.0001,1,2\n`, 'bad_header'],
    ['rows of 200 000 numbers', () => Array.from({ length: 3 }, (_, r) => Array.from({ length: 200_000 }, (_, i) => String(i + r)).join(';')).join('\n'), 'bad_header'],
    ['100 channel columns', () => Array.from({ length: 2000 }, (_, r) => [(r / 10_000).toFixed(4), ...Array.from({ length: 100 }, (_, i) => String(i))].join(',')).join('\n'), 'unsupported_encoding'],
  ] as const)('%s is refused, naming the limit', (_label, make, code) => {
    const result = outcome(new TextEncoder().encode(make()), 'wide.csv');
    expect(result).toBeInstanceOf(CaptureFormatError);
    expect((result as CaptureFormatError).code).toBe(code);
    expect((result as CaptureFormatError).message).toMatch(/64 channel columns|up to 64/);
  });

  it('64 channel columns are still read', () => {
    const text = Array.from({ length: 2000 }, (_, r) => [(r / 10_000).toFixed(4), ...Array.from({ length: 64 }, (_, i) => String((i * r) % 7))].join(',')).join('\n');
    const result = outcome(new TextEncoder().encode(text), 'wide.csv');
    expect(result).not.toBeInstanceOf(CaptureFormatError);
    expect((result as Capture).channels).toHaveLength(64);
  });
});
