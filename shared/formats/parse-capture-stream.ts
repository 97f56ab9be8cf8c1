import { type Capture, type CaptureParser } from './capture';
import { CaptureFormatError } from './capture-format-error';
import { createCsvParser } from './csv-parser';
import { type TimeUnit } from './csv-layout';
import { createWavParser } from './wav-parser';

/**
 * Chooses a reader by the file's first bytes (RIFF → WAV, otherwise CSV/TSV text) and feeds it
 * the chunks of any async iterable — an fs read stream in the CLI and the workers, a Blob stream
 * in the browser. No fs here.
 */
export interface ParseCaptureOptions {
  name?: string;
  timeUnit?: TimeUnit | null;
}

/** Picks the parser for a file from its first bytes (at least 4) and its name. */
export function createCaptureParser(firstBytes: Uint8Array, options: ParseCaptureOptions = {}): CaptureParser {
  const name = options.name ?? 'capture';
  const magic = String.fromCharCode(...firstBytes.subarray(0, 4));
  if (magic === 'RIFF' || magic === 'RF64' || /\.wav$/i.test(name)) return createWavParser(name);
  const utf16 = (firstBytes[0] === 0xff && firstBytes[1] === 0xfe) || (firstBytes[0] === 0xfe && firstBytes[1] === 0xff);
  if (utf16) return createCsvParser({ name, timeUnit: options.timeUnit ?? null });
  let binary = 0;
  const probe = firstBytes.subarray(0, 512);
  for (const b of probe) if (b === 0 || (b < 9 && b !== 0)) binary++;
  if (binary > 0) {
    throw new CaptureFormatError('unknown_format', `${name}: neither a WAV file nor CSV/TSV text; export the capture as WAV or CSV`);
  }
  return createCsvParser({ name, timeUnit: options.timeUnit ?? null });
}

/** Reads a whole capture from chunks (Uint8Array or Buffer). */
export async function parseCaptureStream(chunks: AsyncIterable<Uint8Array>, options: ParseCaptureOptions = {}): Promise<Capture> {
  let parser: CaptureParser | null = null;
  let first: Uint8Array | null = null;
  for await (const chunk of chunks) {
    if (!parser) {
      first = first ? concat(first, chunk) : chunk;
      if (first.length < 4) continue;
      parser = createCaptureParser(first, options);
      parser.feed(first);
      first = null;
    } else parser.feed(chunk);
  }
  if (!parser) {
    if (first && first.length > 0) parser = createCaptureParser(first, options), parser.feed(first);
    else throw new CaptureFormatError('no_data', `${options.name ?? 'capture'}: the file is empty; copy the capture again`);
  }
  return parser.end();
}

/** Reads a capture held whole in memory (tests, small uploads). */
export function parseCaptureBytes(bytes: Uint8Array, options: ParseCaptureOptions = {}): Capture {
  if (bytes.length === 0) throw new CaptureFormatError('no_data', `${options.name ?? 'capture'}: the file is empty; copy the capture again`);
  const p = createCaptureParser(bytes, options);
  p.feed(bytes);
  return p.end();
}

function concat(a: Uint8Array, b: Uint8Array): Uint8Array {
  const out = new Uint8Array(a.length + b.length);
  out.set(a);
  out.set(b, a.length);
  return out;
}
