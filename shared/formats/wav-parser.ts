import { type Capture, type CaptureParser } from './capture';
import { CaptureFormatError, checkSampleRate } from './capture-format-error';

/**
 * Streaming RIFF/WAVE reader: PCM 8/16/24/32-bit integer, IEEE float 32/64-bit, 1–8 channels,
 * WAVE_FORMAT_EXTENSIBLE, any order of non-audio chunks (LIST, fact, …) with odd-size padding.
 * Integer samples are scaled so that full scale reads ±1.0 (int16: value / 32768). Channel 1 is
 * the first interleaved channel. Layout: Microsoft "Multimedia Programming Interface and Data
 * Specifications 1.0" (1991) and the WAVE_FORMAT_EXTENSIBLE note.
 */

const WAVE_FORMAT_PCM = 1;
const WAVE_FORMAT_IEEE_FLOAT = 3;
const WAVE_FORMAT_EXTENSIBLE = 0xfffe;

interface WavFormat {
  encoding: 'int' | 'float';
  bits: number;
  channels: number;
  sampleRateHz: number;
  blockAlign: number;
}

type State =
  | { kind: 'riff' }
  | { kind: 'chunk-header' }
  | { kind: 'skip'; remaining: number }
  | { kind: 'fmt'; size: number }
  | { kind: 'data'; remaining: number; declared: number }
  | { kind: 'done' };

/** Frames per channel allocated before the samples arrive (8 MiB per channel as float32); more grows by doubling. */
const PREALLOCATE_FRAMES = 1 << 21;

/** Creates a WAV chunk parser; `name` appears in error messages (e.g. the file name). */
export function createWavParser(name = 'WAV file'): CaptureParser {
  let pending: Uint8Array = new Uint8Array(0);
  let state: State = { kind: 'riff' };
  let format: WavFormat | null = null;
  let channels: Float32Array[] = [];
  let frames = 0;
  /** Frames the data chunk's header announces (Infinity when it does not say). */
  let declaredFrames = Infinity;
  let sawData = false;
  const notes: string[] = [];

  const append = (chunk: Uint8Array) => {
    if (pending.length === 0) { pending = chunk; return; }
    const next = new Uint8Array(pending.length + chunk.length);
    next.set(pending);
    next.set(chunk, pending.length);
    pending = next;
  };

  const ascii = (b: Uint8Array, off: number) => String.fromCharCode(b[off], b[off + 1], b[off + 2], b[off + 3]);

  function parseFmt(b: Uint8Array, size: number): WavFormat {
    if (size < 16) throw new CaptureFormatError('bad_header', `${name}: the fmt chunk is only ${size} bytes; the file is damaged — export it again`);
    const v = new DataView(b.buffer, b.byteOffset, size);
    let tag = v.getUint16(0, true);
    const nch = v.getUint16(2, true);
    const rate = v.getUint32(4, true);
    const blockAlign = v.getUint16(12, true);
    const bits = v.getUint16(14, true);
    if (tag === WAVE_FORMAT_EXTENSIBLE) {
      if (size < 40) throw new CaptureFormatError('bad_header', `${name}: WAVE_FORMAT_EXTENSIBLE header is too short; export the file again`);
      tag = v.getUint16(24, true);
    }
    if (rate === 0) throw new CaptureFormatError('zero_rate', `${name}: the header gives a sample rate of 0 Hz; export the capture again with its real rate`);
    if (nch < 1 || nch > 8) throw new CaptureFormatError('unsupported_encoding', `${name}: ${nch} channels; Crankwise reads 1–8 channels — export the reference and pickup channels only`);
    let encoding: 'int' | 'float';
    if (tag === WAVE_FORMAT_PCM && [8, 16, 24, 32].includes(bits)) encoding = 'int';
    else if (tag === WAVE_FORMAT_IEEE_FLOAT && (bits === 32 || bits === 64)) encoding = 'float';
    else {
      throw new CaptureFormatError('unsupported_encoding',
        `${name}: sample encoding (format tag ${tag}, ${bits} bit) is not supported; save as PCM 16/24/32-bit or 32-bit float WAV`);
    }
    if (blockAlign !== (nch * bits) / 8) {
      throw new CaptureFormatError('bad_header', `${name}: block align ${blockAlign} does not match ${nch} × ${bits} bit; the header is damaged — export again`);
    }
    checkSampleRate(rate, name);
    return { encoding, bits, channels: nch, sampleRateHz: rate, blockAlign };
  }

  function decodeFrames(b: Uint8Array, offset: number, nFrames: number): void {
    const f = format!;
    const nch = f.channels;
    if (f.bits === 16 && (b.byteOffset + offset) % 2 === 0) {
      // Fast path: an Int16Array view over the chunk (little-endian hosts: every platform Node runs on).
      if (frames + nFrames > channels[0].length) growChannels(frames + nFrames);
      const v16 = new Int16Array(b.buffer, b.byteOffset + offset, nFrames * nch);
      for (let c = 0; c < nch; c++) {
        const ch = channels[c];
        for (let i = 0, j = c; i < nFrames; i++, j += nch) ch[frames + i] = v16[j] / 32768;
      }
      frames += nFrames;
      return;
    }
    if (f.bits === 32 && f.encoding === 'float') {
      // Fast path: a Float32Array view over the chunk (copied once when the chunk is not 4-byte
      // aligned; a Node Buffer's slice is a view, hence the explicit copy), de-interleaved per
      // channel; about twice as fast as a DataView per sample.
      if (frames + nFrames > channels[0].length) growChannels(frames + nFrames);
      const start = b.byteOffset + offset;
      const bytes = nFrames * nch * 4;
      const v32 = start % 4 === 0 ? new Float32Array(b.buffer, start, nFrames * nch) : new Float32Array(new Uint8Array(b.subarray(offset, offset + bytes)).buffer);
      for (let c = 0; c < nch; c++) {
        const bad = deinterleaveFloat32(v32, channels[c], frames, nFrames, nch, c);
        if (bad >= 0) {
          throw new CaptureFormatError('non_finite', `${name}: sample ${frames + bad + 1} of channel ${c + 1} is NaN or infinite; the recording is damaged — record or export it again`);
        }
      }
      frames += nFrames;
      return;
    }
    const v = new DataView(b.buffer, b.byteOffset + offset, nFrames * f.blockAlign);
    let p = 0;
    const base = frames;
    for (let i = 0; i < nFrames; i++) {
      for (let c = 0; c < nch; c++) {
        let s: number;
        switch (f.bits) {
          case 8: s = (v.getUint8(p) - 128) / 128; p += 1; break;
          case 16: s = v.getInt16(p, true) / 32768; p += 2; break;
          case 24: {
            const lo = v.getUint16(p, true);
            const hi = v.getInt8(p + 2);
            s = (hi * 65536 + lo) / 8388608; p += 3; break;
          }
          case 32:
            if (f.encoding === 'float') {
              s = v.getFloat32(p, true);
              if (!Number.isFinite(s)) throw new CaptureFormatError('non_finite', `${name}: sample ${base + i + 1} of channel ${c + 1} is NaN or infinite; the recording is damaged — record or export it again`);
            } else s = v.getInt32(p, true) / 2147483648;
            p += 4; break;
          default:
            s = v.getFloat64(p, true);
            if (!Number.isFinite(s)) throw new CaptureFormatError('non_finite', `${name}: sample ${base + i + 1} of channel ${c + 1} is NaN or infinite; the recording is damaged — record or export it again`);
            p += 8;
        }
        const ch = channels[c];
        if (base + i >= ch.length) growChannels(base + i + 1);
        channels[c][base + i] = s;
      }
    }
    frames += nFrames;
  }

  function growChannels(minLength: number) {
    const len = Math.max(minLength, Math.min(Math.max(channels[0].length * 2, 1024), declaredFrames));
    channels = channels.map((ch) => { const n = new Float32Array(len); n.set(ch); return n; });
  }

  function step(): boolean {
    switch (state.kind) {
      case 'riff': {
        if (pending.length < 12) return false;
        if (ascii(pending, 0) !== 'RIFF' || ascii(pending, 8) !== 'WAVE') {
          const rf64 = ascii(pending, 0) === 'RF64';
          throw new CaptureFormatError(rf64 ? 'unsupported_encoding' : 'bad_magic',
            rf64 ? `${name}: RF64 (over 4 GB) WAV is not supported; export a shorter capture`
              : `${name}: not a WAV file (no RIFF/WAVE header); export the capture as WAV or CSV`);
        }
        pending = pending.subarray(12);
        state = { kind: 'chunk-header' };
        return true;
      }
      case 'chunk-header': {
        if (pending.length < 8) return false;
        const id = ascii(pending, 0);
        const size = new DataView(pending.buffer, pending.byteOffset, 8).getUint32(4, true);
        pending = pending.subarray(8);
        if (id === 'fmt ') state = { kind: 'fmt', size };
        else if (id === 'data') {
          if (!format) throw new CaptureFormatError('bad_header', `${name}: audio data comes before the format chunk; export the file again`);
          sawData = true;
          const declared = size === 0xffffffff || size === 0 ? Infinity : size;
          if (Number.isFinite(declared)) {
            // The header's length is a claim, not bytes in hand: allocate at most PREALLOCATE_FRAMES
            // up front and grow (up to the claim) as data arrives, so a header announcing 2^31
            // samples costs nothing until the samples exist (it then ends as `truncated`).
            declaredFrames = Math.floor(declared / format.blockAlign);
            const n = Math.min(declaredFrames, PREALLOCATE_FRAMES);
            channels = Array.from({ length: format.channels }, () => new Float32Array(n));
          } else {
            channels = Array.from({ length: format.channels }, () => new Float32Array(1 << 16));
            notes.push('the WAV data chunk did not state its length; read to the end of the file');
          }
          state = { kind: 'data', remaining: declared, declared };
        } else state = { kind: 'skip', remaining: size + (size & 1) };
        return true;
      }
      case 'skip': {
        const n = Math.min(state.remaining, pending.length);
        pending = pending.subarray(n);
        state.remaining -= n;
        if (state.remaining > 0) return false;
        state = sawData ? { kind: 'done' } : { kind: 'chunk-header' };
        return true;
      }
      case 'fmt': {
        const padded = state.size + (state.size & 1);
        if (pending.length < padded) return false;
        format = parseFmt(pending, state.size);
        pending = pending.subarray(padded);
        state = { kind: 'chunk-header' };
        return true;
      }
      case 'data': {
        const f = format!;
        const avail = Math.min(pending.length, state.remaining);
        const nFrames = Math.floor(avail / f.blockAlign);
        if (nFrames === 0) return false;
        decodeFrames(pending, 0, nFrames);
        const used = nFrames * f.blockAlign;
        pending = pending.subarray(used);
        state.remaining -= used;
        if (state.remaining < f.blockAlign) {
          const pad = (state.declared & 1) === 1 ? 1 : 0;
          state = { kind: 'skip', remaining: state.remaining + pad };
          sawData = true;
        }
        return true;
      }
      case 'done':
        pending = new Uint8Array(0);
        return false;
    }
  }

  return {
    feed(chunk: Uint8Array) {
      append(chunk);
      while (step()) { /* consume as much as the buffered bytes allow */ }
      // Keep a private copy of a small remainder: the caller may reuse its chunk buffer.
      if (pending.length > 0 && pending.length < 1 << 16) pending = pending.slice();
    },
    end(): Capture {
      if (state.kind === 'riff') {
        throw new CaptureFormatError(pending.length === 0 ? 'no_data' : 'truncated',
          pending.length === 0 ? `${name}: the file is empty; copy the capture again` : `${name}: the file ends inside the WAV header; copy the capture again`);
      }
      if (!format) throw new CaptureFormatError('truncated', `${name}: the file ends before the WAV format chunk; copy the capture again`);
      if (!sawData) throw new CaptureFormatError('truncated', `${name}: the file ends before the audio data; copy the capture again`);
      if (state.kind === 'data' && Number.isFinite(state.remaining)) {
        const got = frames / format.sampleRateHz;
        const want = state.declared / format.blockAlign / format.sampleRateHz;
        throw new CaptureFormatError('truncated',
          `${name}: the file is truncated (${got.toFixed(2)} s of the ${want.toFixed(2)} s the header announces); copy the capture again`);
      }
      if (frames === 0) throw new CaptureFormatError('no_data', `${name}: the WAV file holds no samples; record the capture again`);
      const out = channels.map((ch) => (ch.length === frames ? ch : ch.slice(0, frames)));
      return {
        format: 'wav',
        sampleRateHz: format.sampleRateHz,
        channels: out,
        channelNames: out.map((_, i) => `channel ${i + 1}`),
        channelUnits: out.map(() => null),
        notes,
      };
    },
  };
}

/**
 * Copies channel `c` of `n` interleaved float32 frames into `out` from index `at`; returns the
 * frame index of the first NaN or infinite sample, or −1 (x − x is NaN exactly for those).
 */
function deinterleaveFloat32(v: Float32Array, out: Float32Array, at: number, n: number, nch: number, c: number): number {
  let bad = 0;
  for (let i = 0, j = c; i < n; i++, j += nch) {
    const s = v[j];
    bad += s - s;
    out[at + i] = s;
  }
  if (bad === 0) return -1;
  for (let i = 0, j = c; i < n; i++, j += nch) if (!Number.isFinite(v[j])) return i;
  return -1;
}
