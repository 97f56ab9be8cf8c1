/** Full scale of the Web Audio float samples; a sample this close to it counts as clipped. */
export const CLIP_LEVEL = 0.999;

/** Peak level in dBFS (−Infinity for silence) and whether any sample clipped, per channel. */
export function channelLevels(channels: readonly Float32Array[]): { peakDbfs: number; clipped: boolean }[] {
  return channels.map((c) => {
    let peak = 0;
    for (let i = 0; i < c.length; i++) { const a = Math.abs(c[i]); if (a > peak) peak = a; }
    return { peakDbfs: peak > 0 ? 20 * Math.log10(peak) : -Infinity, clipped: peak >= CLIP_LEVEL };
  });
}

/** Concatenates blocks of per-channel samples into one array per channel. */
export function joinBlocks(blocks: readonly Float32Array[][], channels: number): Float32Array[] {
  const total = blocks.reduce((n, b) => n + b[0].length, 0);
  const out = Array.from({ length: channels }, () => new Float32Array(total));
  let at = 0;
  for (const b of blocks) {
    for (let c = 0; c < channels; c++) out[c].set(b[Math.min(c, b.length - 1)], at);
    at += b[0].length;
  }
  return out;
}
