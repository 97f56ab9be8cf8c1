import { describe, expect, it } from 'vitest';
import { WaveFile } from 'wavefile';
import { CaptureFormatError } from '../../../shared/formats/capture-format-error';
import { createWavParser } from '../../../shared/formats/wav-parser';
import { parseCaptureBytes } from '../../../shared/formats/parse-capture-stream';

/** Feeds the bytes in chunks of `size` (to exercise the streaming state machine). */
function readInChunks(bytes: Uint8Array, size: number) {
  const p = createWavParser('test.wav');
  for (let i = 0; i < bytes.length; i += size) p.feed(bytes.slice(i, i + size));
  return p.end();
}

/** A WAV built by hand (RIFF layout per the Microsoft RIFF/WAVE specification, 1991). */
function handWav(o: { tag: number; bits: number; channels: number; rate: number; frames: number; extensible?: boolean; list?: string; dataSize?: number; fill?: (i: number, c: number) => number }): Uint8Array {
  const bytesPer = o.bits / 8;
  const dataLen = o.frames * o.channels * bytesPer;
  const fmtLen = o.extensible ? 40 : 16;
  const listLen = o.list ? 4 + o.list.length : 0;
  const listPad = listLen & 1;
  const total = 12 + 8 + fmtLen + (o.list ? 8 + listLen + listPad : 0) + 8 + dataLen;
  const b = new Uint8Array(total);
  const v = new DataView(b.buffer);
  const put = (off: number, s: string) => { for (let i = 0; i < s.length; i++) b[off + i] = s.charCodeAt(i); };
  put(0, 'RIFF'); v.setUint32(4, total - 8, true); put(8, 'WAVE');
  let p = 12;
  put(p, 'fmt '); v.setUint32(p + 4, fmtLen, true); p += 8;
  v.setUint16(p, o.extensible ? 0xfffe : o.tag, true); v.setUint16(p + 2, o.channels, true); v.setUint32(p + 4, o.rate, true);
  v.setUint32(p + 8, o.rate * o.channels * bytesPer, true); v.setUint16(p + 12, o.channels * bytesPer, true); v.setUint16(p + 14, o.bits, true);
  if (o.extensible) { v.setUint16(p + 16, 22, true); v.setUint16(p + 18, o.bits, true); v.setUint32(p + 20, 0, true); v.setUint16(p + 24, o.tag, true); }
  p += fmtLen;
  if (o.list) { put(p, 'LIST'); v.setUint32(p + 4, listLen, true); put(p + 8, 'INFO'); put(p + 12, o.list); p += 8 + listLen + listPad; }
  put(p, 'data'); v.setUint32(p + 4, o.dataSize ?? dataLen, true); p += 8;
  for (let i = 0; i < o.frames; i++) {
    for (let c = 0; c < o.channels; c++) {
      const s = o.fill ? o.fill(i, c) : 0;
      if (o.tag === 3) v.setFloat32(p, s, true);
      else if (o.bits === 16) v.setInt16(p, Math.round(s * 32767), true);
      else if (o.bits === 24) { const q = Math.round(s * 8388607); b[p] = q & 255; b[p + 1] = (q >> 8) & 255; b[p + 2] = (q >> 16) & 255; }
      else v.setInt32(p, Math.round(s * 2147483647), true);
      p += bytesPer;
    }
  }
  return b;
}

const ramp = (i: number, c: number) => Math.sin(i * 0.01 + c) * 0.5;

describe('WAV reader', () => {
  it('reads 16-bit PCM written by the wavefile package, full scale = 1.0, channel 1 first', () => {
    const wav = new WaveFile();
    const a = Int16Array.from({ length: 1000 }, (_, i) => (i % 2 ? 16384 : -32768));
    const b = Int16Array.from({ length: 1000 }, () => 8192);
    wav.fromScratch(2, 48000, '16', [a, b]);
    const cap = readInChunks(wav.toBuffer(), 7);
    expect(cap.sampleRateHz).toBe(48000);
    expect(cap.channels).toHaveLength(2);
    expect(cap.channels[0][0]).toBe(-1);
    expect(cap.channels[0][1]).toBe(0.5);
    expect(cap.channels[1][10]).toBe(0.25);
  });

  for (const [bits, tag, tol] of [[24, 1, 1e-6], [32, 1, 1e-8], [32, 3, 1e-7]] as const) {
    it(`reads ${tag === 3 ? 'float' : 'PCM'} ${bits}-bit, 3 channels, WAVE_FORMAT_EXTENSIBLE with an odd LIST chunk`, () => {
      const bytes = handWav({ tag, bits, channels: 3, rate: 20000, frames: 5000, extensible: true, list: 'ISFTabc', fill: ramp });
      const cap = readInChunks(bytes, 4093);
      expect(cap.channels).toHaveLength(3);
      expect(cap.channels[2].length).toBe(5000);
      for (const i of [0, 17, 4999]) expect(Math.abs(cap.channels[2][i] - ramp(i, 2))).toBeLessThan(tol * 2 + 1e-7);
    });
  }

  it('reads up to 8 channels', () => {
    const cap = parseCaptureBytes(handWav({ tag: 1, bits: 16, channels: 8, rate: 8000, frames: 100, fill: (i, c) => c / 10 }), { name: 'x.wav' });
    expect(cap.channels).toHaveLength(8);
    expect(cap.channels[7][50]).toBeCloseTo(0.7, 3);
  });

  const bad: [string, () => Uint8Array, string][] = [
    ['truncated', () => handWav({ tag: 1, bits: 16, channels: 2, rate: 48000, frames: 1000 }).slice(0, 60), 'truncated'],
    ['bad_magic', () => new TextEncoder().encode('OggS this is not a wav file at all'), 'bad_magic'],
    ['zero_rate', () => handWav({ tag: 1, bits: 16, channels: 2, rate: 0, frames: 10 }), 'zero_rate'],
    ['no_data', () => handWav({ tag: 1, bits: 16, channels: 2, rate: 48000, frames: 0 }), 'no_data'],
    ['unsupported_encoding', () => handWav({ tag: 2, bits: 16, channels: 2, rate: 48000, frames: 10 }), 'unsupported_encoding'],
    ['non_finite', () => handWav({ tag: 3, bits: 32, channels: 1, rate: 48000, frames: 10, fill: (i) => (i === 5 ? NaN : 0) }), 'non_finite'],
    ['rate_out_of_range', () => handWav({ tag: 1, bits: 16, channels: 1, rate: 500, frames: 10 }), 'rate_out_of_range'],
  ];
  for (const [name, make, code] of bad) {
    it(`refuses a ${name} file with code ${code} and a message saying what to do`, () => {
      let err: unknown;
      try { readInChunks(make(), 13); } catch (e) { err = e; }
      expect(err).toBeInstanceOf(CaptureFormatError);
      expect((err as CaptureFormatError).code).toBe(code);
      expect((err as Error).message).toMatch(/test\.wav/);
      expect((err as Error).message).not.toContain('\n');
    });
  }
});
