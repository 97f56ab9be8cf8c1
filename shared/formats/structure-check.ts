/**
 * The structure-only check an upload passes while it streams (issue 15 item 3): it keeps no
 * samples. WAV: the RIFF/WAVE header, the chunk layout, the fmt chunk (encoding, channels, rate,
 * block align) and the data chunk's declared length against the bytes that actually came. CSV/TSV:
 * the layout and column count decided on the first lines, and the first rows read against it (the
 * CSV reader runs over the first lines only and its samples are dropped). The format comes from the
 * content, never the name. A failure throws the readers' CaptureFormatError with its stable code;
 * what passes here can still fail later in the worker (a bad row deep in the file, no reference…).
 */
import { CaptureFormatError, checkSampleRate } from './capture-format-error';
import { createCsvParser } from './csv-parser';
import { detectCsvLayout } from './csv-layout';

/** What the check learnt about a file. */
export interface StructureInfo {
  format: 'wav' | 'csv';
  /** Channels in the file. */
  channels: number;
  /** WAV only (CSV rates are fitted over the whole time column in the worker). */
  sampleRateHz: number | null;
  durationS: number | null;
}

/** A streaming structure checker: `feed` each chunk, then `end` (both throw CaptureFormatError). */
export interface StructureChecker {
  feed(chunk: Uint8Array): void;
  end(): StructureInfo;
}

/** Bytes of a CSV's head that are read against its layout. */
const CSV_HEAD_BYTES = 256 * 1024;
const CSV_HEAD_LINES = 600;

/** A checker for a file whose name (for messages only) is `name`. */
export function createStructureChecker(name: string): StructureChecker {
  let first: Uint8Array = new Uint8Array(0);
  let inner: StructureChecker | null = null;
  const choose = (atEof: boolean) => {
    if (first.length === 0) throw new CaptureFormatError('no_data', `${name}: the file is empty; copy the capture again`);
    const magic = String.fromCharCode(...first.subarray(0, 4));
    if (magic === 'RIFF' || magic === 'RF64') inner = wavChecker(name);
    else if (looksLikeText(first)) inner = csvChecker(name);
    else throw new CaptureFormatError('unknown_format', `${name}: neither a WAV file nor CSV/TSV text; export the capture as WAV or CSV`);
    const bytes = first;
    first = new Uint8Array(0);
    inner.feed(bytes);
    void atEof;
  };
  return {
    feed(chunk) {
      if (inner) { inner.feed(chunk); return; }
      const next = new Uint8Array(first.length + chunk.length);
      next.set(first);
      next.set(chunk, first.length);
      first = next;
      if (first.length >= 512) choose(false);
    },
    end() {
      if (!inner) choose(true);
      return inner!.end();
    },
  };
}

function looksLikeText(b: Uint8Array): boolean {
  const utf16 = (b[0] === 0xff && b[1] === 0xfe) || (b[0] === 0xfe && b[1] === 0xff);
  if (utf16) return true;
  for (const x of b.subarray(0, 512)) if (x === 0 || x < 9) return false;
  return true;
}

function wavChecker(name: string): StructureChecker {
  let header = new Uint8Array(0);
  let pos = 0; // bytes consumed so far
  let state: 'riff' | 'chunk' | 'skip' | 'fmt' | 'data' | 'after' = 'riff';
  let skip = 0;
  let fmtSize = 0;
  let dataDeclared = 0;
  let dataGot = 0;
  let fmt: { channels: number; rate: number; blockAlign: number } | null = null;
  const ascii = (b: Uint8Array, o: number) => String.fromCharCode(b[o], b[o + 1], b[o + 2], b[o + 3]);
  const take = (chunk: Uint8Array) => {
    const next = new Uint8Array(header.length + chunk.length);
    next.set(header);
    next.set(chunk, header.length);
    header = next;
  };
  const step = (): boolean => {
    switch (state) {
      case 'riff':
        if (header.length < 12) return false;
        if (ascii(header, 0) === 'RF64') throw new CaptureFormatError('unsupported_encoding', `${name}: RF64 (over 4 GB) WAV is not supported; export a shorter capture`);
        if (ascii(header, 0) !== 'RIFF' || ascii(header, 8) !== 'WAVE') throw new CaptureFormatError('bad_magic', `${name}: not a WAV file (no RIFF/WAVE header); export the capture as WAV or CSV`);
        header = header.subarray(12);
        state = 'chunk';
        return true;
      case 'chunk': {
        if (header.length < 8) return false;
        const id = ascii(header, 0);
        const size = new DataView(header.buffer, header.byteOffset, 8).getUint32(4, true);
        header = header.subarray(8);
        if (id === 'fmt ') { state = 'fmt'; fmtSize = size; } else if (id === 'data') {
          if (!fmt) throw new CaptureFormatError('bad_header', `${name}: audio data comes before the format chunk; export the file again`);
          dataDeclared = size === 0 || size === 0xffffffff ? Infinity : size;
          state = 'data';
        } else if (!/^[\x20-\x7e]{4}$/.test(id)) {
          throw new CaptureFormatError('bad_header', `${name}: damaged chunk layout (chunk id is not text); export the file again`);
        } else { state = 'skip'; skip = size + (size & 1); }
        return true;
      }
      case 'skip': {
        const n = Math.min(skip, header.length);
        header = header.subarray(n);
        skip -= n;
        if (skip > 0) return false;
        state = fmt && dataDeclared ? 'after' : 'chunk';
        return true;
      }
      case 'fmt': {
        const padded = fmtSize + (fmtSize & 1);
        if (fmtSize < 16) throw new CaptureFormatError('bad_header', `${name}: the fmt chunk is only ${fmtSize} bytes; the file is damaged — export it again`);
        if (header.length < padded) return false;
        const v = new DataView(header.buffer, header.byteOffset, fmtSize);
        let tag = v.getUint16(0, true);
        const channels = v.getUint16(2, true);
        const rate = v.getUint32(4, true);
        const blockAlign = v.getUint16(12, true);
        const bits = v.getUint16(14, true);
        if (tag === 0xfffe && fmtSize >= 40) tag = v.getUint16(24, true);
        if (rate === 0) throw new CaptureFormatError('zero_rate', `${name}: the header gives a sample rate of 0 Hz; export the capture again with its real rate`);
        if (channels < 1 || channels > 8) throw new CaptureFormatError('unsupported_encoding', `${name}: ${channels} channels; Crankwise reads 1–8 channels — export the reference and pickup channels only`);
        const ok = (tag === 1 && [8, 16, 24, 32].includes(bits)) || (tag === 3 && (bits === 32 || bits === 64));
        if (!ok) throw new CaptureFormatError('unsupported_encoding', `${name}: sample encoding (format tag ${tag}, ${bits} bit) is not supported; save as PCM 16/24/32-bit or 32-bit float WAV`);
        if (blockAlign !== (channels * bits) / 8) throw new CaptureFormatError('bad_header', `${name}: block align ${blockAlign} does not match ${channels} × ${bits} bit; the header is damaged — export again`);
        checkSampleRate(rate, name);
        fmt = { channels, rate, blockAlign };
        header = header.subarray(padded);
        state = 'chunk';
        return true;
      }
      case 'data': {
        const n = Math.min(header.length, dataDeclared - dataGot);
        dataGot += n;
        header = header.subarray(n);
        if (dataGot >= dataDeclared) { state = 'after'; }
        return header.length > 0 && state === 'after';
      }
      case 'after':
        header = new Uint8Array(0);
        return false;
    }
  };
  return {
    feed(chunk) {
      pos += chunk.length;
      if (state === 'data' && header.length === 0) {
        // Fast path: count data bytes without copying.
        const n = Math.min(chunk.length, dataDeclared - dataGot);
        dataGot += n;
        if (dataGot >= dataDeclared) state = 'after';
        return;
      }
      if (state === 'after') return;
      take(chunk);
      while (step()) { /* consume */ }
      if (header.length > 0 && header.length < 1 << 16) header = header.slice();
    },
    end() {
      void pos;
      if (state === 'riff') throw new CaptureFormatError('truncated', `${name}: the file ends inside the WAV header; copy the capture again`);
      if (!fmt) throw new CaptureFormatError('truncated', `${name}: the file ends before the WAV format chunk; copy the capture again`);
      if (state !== 'data' && state !== 'after') throw new CaptureFormatError('truncated', `${name}: the file ends before the audio data; copy the capture again`);
      if (state === 'data' && Number.isFinite(dataDeclared)) {
        const got = dataGot / fmt.blockAlign / fmt.rate;
        const want = dataDeclared / fmt.blockAlign / fmt.rate;
        throw new CaptureFormatError('truncated', `${name}: the file is truncated (${got.toFixed(2)} s of the ${want.toFixed(2)} s the header announces); copy the capture again`);
      }
      const frames = Math.floor(dataGot / fmt.blockAlign);
      if (frames === 0) throw new CaptureFormatError('no_data', `${name}: the WAV file holds no samples; record the capture again`);
      return { format: 'wav', channels: fmt.channels, sampleRateHz: fmt.rate, durationS: frames / fmt.rate };
    },
  };
}

function csvChecker(name: string): StructureChecker {
  const parser = createCsvParser({ name });
  const headChunks: Uint8Array[] = [];
  let headBytes = 0;
  let lines = 0;
  let done = false;
  let sawEnd = true;
  return {
    feed(chunk) {
      if (done) { sawEnd = false; return; }
      let piece = chunk;
      if (headBytes + piece.length > CSV_HEAD_BYTES) piece = piece.subarray(0, CSV_HEAD_BYTES - headBytes);
      // Count lines; stop at a whole line once enough are in.
      for (let i = 0; i < piece.length; i++) {
        if (piece[i] === 10 && ++lines >= CSV_HEAD_LINES) { piece = piece.subarray(0, i + 1); done = true; break; }
      }
      if (headBytes + piece.length >= CSV_HEAD_BYTES) done = true;
      if (piece.length < chunk.length) sawEnd = false;
      headBytes += piece.length;
      headChunks.push(piece);
      parser.feed(piece);
    },
    end() {
      const head = new TextDecoder().decode(concat(headChunks));
      const all = head.split(/\r\n|\r|\n/);
      // Without the whole file, the last line may be cut: keep whole lines only.
      const whole = sawEnd && !done ? all : all.slice(0, -1);
      if (whole.length === 0 && done) {
        // One line fills the whole head (a header of a million columns): not a capture export.
        throw new CaptureFormatError('bad_header',
          `${name}: the first line runs past ${CSV_HEAD_BYTES / 1024} KB without a line end; Crankwise reads a time column and up to 64 channel columns — export the time, reference and pickup columns only`);
      }
      const layout = detectCsvLayout(whole.filter((l, i) => i < CSV_HEAD_LINES), name, null, sawEnd && !done);
      if (sawEnd && !done) parser.end();
      return { format: 'csv', channels: layout.channelColumns.length, sampleRateHz: null, durationS: null };
    },
  };
}

function concat(parts: Uint8Array[]): Uint8Array {
  const n = parts.reduce((s, p) => s + p.length, 0);
  const out = new Uint8Array(n);
  let o = 0;
  for (const p of parts) { out.set(p, o); o += p.length; }
  return out;
}
