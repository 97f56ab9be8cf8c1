import { describe, expect, it } from 'vitest';
import { encodeWav } from '../../../shared/synth/encode-wav';
import { encodeCsv } from '../../../shared/synth/encode-csv';
import { parseCaptureBytes } from '../../../shared/formats/parse-capture-stream';
import { generateCapture } from '../../../shared/synth/generate-capture';
import { drives } from '../../helpers/scenarios';

// WAV layout: Microsoft/IBM "Multimedia Programming Interface and Data Specifications 1.0" (1991):
// RIFF size = file − 8; fmt: format tag (1 PCM, 3 IEEE float), channels, rate, byte rate, block align, bits.

const tone = (n: number, f: number, a: number) => Float32Array.from({ length: n }, (_, i) => a * Math.sin((2 * Math.PI * f * i) / 8000));

describe('encodeWav', () => {
  it('writes a 16-bit PCM header and interleaved, rounded samples', () => {
    const bytes = encodeWav([Float32Array.from([0, 0.5, -1]), Float32Array.from([1, -0.25, 2])], 8000, 'pcm16');
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    const text = (o: number) => String.fromCharCode(...bytes.subarray(o, o + 4));
    expect(text(0)).toBe('RIFF');
    expect(view.getUint32(4, true)).toBe(bytes.length - 8);
    expect(text(8)).toBe('WAVE');
    expect(view.getUint16(20, true)).toBe(1);
    expect(view.getUint16(22, true)).toBe(2);
    expect(view.getUint32(24, true)).toBe(8000);
    expect(view.getUint32(28, true)).toBe(8000 * 4);
    expect(view.getUint16(32, true)).toBe(4);
    expect(view.getUint16(34, true)).toBe(16);
    expect(text(36)).toBe('data');
    const samples = Array.from({ length: 6 }, (_, i) => view.getInt16(44 + 2 * i, true));
    // Interleaved ch1, ch2; x·32768 rounded, +1.0 and 2.0 clipped to 32767.
    expect(samples).toEqual([0, 32767, 16384, -8192, -32768, 32767]);
  });

  it('round-trips float32 and 16-bit captures through the signal-core WAV reader', () => {
    const channels = [tone(4000, 50, 0.8), tone(4000, 1234, 0.3), tone(4000, 7, 0.1)];
    const f32 = parseCaptureBytes(encodeWav(channels, 8000, 'float32'), { name: 'gen.wav' });
    expect(f32.sampleRateHz).toBe(8000);
    expect(f32.channels).toHaveLength(3);
    for (let c = 0; c < 3; c++) expect(Array.from(f32.channels[c])).toEqual(Array.from(channels[c]));
    const i16 = parseCaptureBytes(encodeWav(channels, 8000, 'pcm16'), { name: 'gen.wav' });
    for (let c = 0; c < 3; c++) {
      let worst = 0;
      for (let i = 0; i < 4000; i++) worst = Math.max(worst, Math.abs(i16.channels[c][i] - channels[c][i]));
      expect(worst).toBeLessThanOrEqual(0.5 / 32768 + 1e-9);
    }
  });

  it('refuses unequal channels and a bad rate', () => {
    expect(() => encodeWav([new Float32Array(3), new Float32Array(4)], 8000, 'pcm16')).toThrow(RangeError);
    expect(() => encodeWav([new Float32Array(3)], 0, 'pcm16')).toThrow(/sample rate/);
  });
});

describe('encodeCsv', () => {
  it('writes a time column in seconds then one column per channel', () => {
    const text = encodeCsv([Float32Array.from([0.5, -0.25]), Float32Array.from([1, 2])], 1000, { timeUnit: 's' });
    expect(text.split('\n').slice(0, 3)).toEqual(['time_s,ch1,ch2', '0.0000,0.500000,1.00000', '0.0010,-0.250000,2.00000']);
  });

  it('refuses a decimal comma with a comma separator', () => {
    expect(() => encodeCsv([new Float32Array(2)], 1000, { timeUnit: 's', separator: ',', decimalComma: true })).toThrow(/decimal comma/);
  });

  it.each([
    ['seconds, comma separated', { timeUnit: 's' as const }],
    ['milliseconds, scope-style preamble, units, semicolons and decimal comma', {
      timeUnit: 'ms' as const, preamble: ['bench scope export (generated)'], separator: ';' as const, decimalComma: true, units: ['V', 'g'], names: ['reference', 'pickup'],
    }],
  ])('round-trips a generated capture through the signal-core CSV reader (%s)', (_label, options) => {
    const capture = generateCapture({ drive: drives.i4Petrol, seed: 2, durationS: 1, sampleRateHz: 20000 });
    const text = encodeCsv(capture.channels, capture.sampleRateHz, options);
    const parsed = parseCaptureBytes(new TextEncoder().encode(text), { name: 'gen.csv' });
    expect(parsed.sampleRateHz).toBeCloseTo(20000, 3);
    expect(parsed.channels).toHaveLength(2);
    for (let c = 0; c < 2; c++) {
      let worst = 0;
      let peak = 0;
      for (let i = 0; i < capture.channels[c].length; i++) {
        worst = Math.max(worst, Math.abs(parsed.channels[c][i] - capture.channels[c][i]));
        peak = Math.max(peak, Math.abs(capture.channels[c][i]));
      }
      // Six significant digits.
      expect(worst).toBeLessThan(peak * 1e-5);
    }
  });
});
