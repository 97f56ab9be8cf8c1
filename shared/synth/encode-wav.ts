/**
 * WAV encoder for generated captures (RIFF/WAVE, little-endian): 16-bit PCM (format tag 1) or
 * 32-bit IEEE float (format tag 3, with the `fact` chunk non-PCM files carry), channels
 * interleaved, channel 1 first. Full scale is ±1.0; 16-bit samples are round(x·32768) clipped to −32768…32767 (so a reader
 * dividing by 32768 gets the value back to half a step).
 * Pure: returns the file's bytes.
 */

/** Sample encodings the generator writes. */
export type WavEncoding = 'pcm16' | 'float32';

/**
 * Encodes equal-length channels as a WAV file. Throws RangeError for no channels, more than 8,
 * unequal lengths, or a sample rate that is not a positive integer.
 */
export function encodeWav(channels: readonly Float32Array[], sampleRateHz: number, encoding: WavEncoding): Uint8Array {
  if (channels.length < 1 || channels.length > 8) throw new RangeError(`a WAV capture needs 1–8 channels, got ${channels.length}`);
  const frames = channels[0].length;
  if (channels.some((c) => c.length !== frames)) throw new RangeError(`all channels must have the same length, got ${channels.map((c) => c.length).join(', ')}`);
  if (!(Number.isInteger(sampleRateHz) && sampleRateHz > 0)) throw new RangeError(`sample rate must be a positive whole number of hertz, got ${sampleRateHz}`);
  const float = encoding === 'float32';
  const bytesPerSample = float ? 4 : 2;
  const blockAlign = channels.length * bytesPerSample;
  const dataBytes = frames * blockAlign;
  const fmtBytes = float ? 18 : 16;
  const factBytes = float ? 12 : 0;
  const total = 12 + 8 + fmtBytes + factBytes + 8 + dataBytes;
  const buffer = new ArrayBuffer(total);
  const view = new DataView(buffer);
  const bytes = new Uint8Array(buffer);
  let p = 0;
  const tag = (s: string) => { for (let i = 0; i < 4; i++) bytes[p++] = s.charCodeAt(i); };
  const u32 = (v: number) => { view.setUint32(p, v, true); p += 4; };
  const u16 = (v: number) => { view.setUint16(p, v, true); p += 2; };
  tag('RIFF'); u32(total - 8); tag('WAVE');
  tag('fmt '); u32(fmtBytes);
  u16(float ? 3 : 1); u16(channels.length); u32(sampleRateHz); u32(sampleRateHz * blockAlign); u16(blockAlign); u16(bytesPerSample * 8);
  if (float) { u16(0); tag('fact'); u32(4); u32(frames); }
  tag('data'); u32(dataBytes);
  for (let i = 0; i < frames; i++) {
    for (const channel of channels) {
      const x = channel[i];
      if (float) { view.setFloat32(p, x, true); p += 4; } else {
        view.setInt16(p, Math.max(-32768, Math.min(32767, Math.round(x * 32768))), true);
        p += 2;
      }
    }
  }
  return bytes;
}
