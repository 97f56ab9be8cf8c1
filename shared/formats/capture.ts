/**
 * A decoded capture and the chunk-parser interface every reader implements. Readers never touch
 * fs: the CLI and the workers feed them file chunks (see `parse-capture-stream.ts`).
 */

export type CaptureFormat = 'wav' | 'csv';

/** Samples per channel in float32 (WAV full scale = 1.0; CSV in the column's units). */
export interface Capture {
  format: CaptureFormat;
  sampleRateHz: number;
  channels: Float32Array[];
  /** Column names (CSV header) or "channel N" (WAV). */
  channelNames: string[];
  /** Units from a CSV unit row, when present. */
  channelUnits: (string | null)[];
  /** Notes on how the file was read (e.g. the fitted rate) for the warnings list. */
  notes: string[];
}

/** A streaming reader: feed the file in chunks of any size, then `end()` returns the capture. */
export interface CaptureParser {
  feed(chunk: Uint8Array): void;
  end(): Capture;
}

/** A float32 buffer that grows by doubling (for readers that do not know the sample count). */
export class GrowableFloat32 {
  private data: Float32Array;
  length = 0;

  constructor(initialCapacity = 1 << 14) {
    this.data = new Float32Array(Math.max(16, initialCapacity));
  }

  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Float32Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }

  /** The filled part (a view; copy it if the buffer will be reused). */
  toArray(): Float32Array {
    return this.data.subarray(0, this.length);
  }
}

/** A float64 growable buffer (CSV time column: times need double precision). */
export class GrowableFloat64 {
  private data: Float64Array;
  length = 0;

  constructor(initialCapacity = 1 << 14) {
    this.data = new Float64Array(Math.max(16, initialCapacity));
  }

  push(v: number): void {
    if (this.length === this.data.length) {
      const next = new Float64Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.length++] = v;
  }

  toArray(): Float64Array {
    return this.data.subarray(0, this.length);
  }
}
