// The upload's structure-only check agrees with the full readers: a good file passes with the
// reader's channel count (and, for WAV, its rate and duration); each malformed kind is refused with
// the same stable code the full reader gives, fed in small chunks as an upload arrives.
import { describe, expect, it } from 'vitest';
import { parseCaptureBytes } from '../../../shared/formats/parse-capture-stream';
import { CaptureFormatError } from '../../../shared/formats/capture-format-error';
import { createStructureChecker } from '../../../shared/formats/structure-check';
import { encodeCsv } from '../../../shared/synth/encode-csv';
import { encodeWav } from '../../../shared/synth/encode-wav';
import { generateCapture } from '../../../shared/synth/generate-capture';
import { drives } from '../../helpers/scenarios';

const gen = generateCapture({ drive: drives.i4Petrol, durationS: 1, sampleRateHz: 8000, seed: 3 });
const wav = encodeWav(gen.channels, 8000, 'pcm16');
const csv = new TextEncoder().encode(encodeCsv(gen.channels, 8000, { timeUnit: 's' }));

function check(bytes: Uint8Array, chunk = 1000) {
  const c = createStructureChecker('capture');
  for (let o = 0; o < bytes.length; o += chunk) c.feed(bytes.subarray(o, o + chunk));
  return c.end();
}

function codeOf(fn: () => unknown): string | null {
  try {
    fn();
    return null;
  } catch (e) {
    if (e instanceof CaptureFormatError) return e.code;
    throw e;
  }
}

describe('structure check', () => {
  it('passes a good WAV with the reader\'s channels, rate and duration', () => {
    const full = parseCaptureBytes(wav);
    const info = check(wav);
    expect(info).toEqual({ format: 'wav', channels: full.channels.length, sampleRateHz: full.sampleRateHz, durationS: full.channels[0].length / full.sampleRateHz });
  });

  it('passes a good CSV with the reader\'s channel count, whatever its name says', () => {
    const info = check(csv, 777);
    expect(info.format).toBe('csv');
    expect(info.channels).toBe(parseCaptureBytes(csv, { name: 'x' }).channels.length);
  });

  const truncated = wav.subarray(0, wav.length - 501);
  const zeroRate = wav.slice();
  new DataView(zeroRate.buffer).setUint32(24, 0, true);
  const badAlign = wav.slice();
  new DataView(badAlign.buffer).setUint16(32, 3, true);
  const lines = new TextDecoder().decode(csv).split('\n');
  lines[30] = '0.1,abc,0.2';
  const textCell = new TextEncoder().encode(lines.join('\n'));
  const kinds: [string, Uint8Array][] = [
    ['truncated WAV', truncated],
    ['0 Hz WAV', zeroRate],
    ['block align not matching the channels', badAlign],
    ['binary that is neither', Uint8Array.from({ length: 3000 }, (_, i) => (i * 31) % 256)],
    ['text in an early CSV row', textCell],
    ['empty', new Uint8Array(0)],
  ];
  for (const [name, bytes] of kinds) {
    it(`refuses ${name} with the full reader's code`, () => {
      const expected = codeOf(() => parseCaptureBytes(bytes, { name: 'capture' }));
      expect(expected).not.toBeNull();
      expect(codeOf(() => check(bytes, 333))).toBe(expected);
    });
  }
});
