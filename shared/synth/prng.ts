/**
 * A small seeded pseudo-random generator for the capture generator, so that one seed always gives
 * the same capture on every platform. Uniforms come from mulberry32 (a 32-bit state, period 2^32;
 * public-domain algorithm by T. Ettinger), normals from the Box–Muller transform (G. E. P. Box &
 * M. E. Muller, Ann. Math. Statist. 29(2):610–611, 1958). Not for cryptography.
 */

/** A seeded random source: every call advances its state. */
export interface Rng {
  /** Uniform in [0, 1). */
  uniform(): number;
  /** Uniform in [lo, hi). */
  between(lo: number, hi: number): number;
  /** Standard normal (mean 0, standard deviation 1). */
  normal(): number;
  /** An independent generator derived from this one (for one signal part, so parts do not shift each other's draws). */
  fork(): Rng;
}

/**
 * Creates a generator from a 32-bit integer seed (other numbers are truncated to 32 bits).
 * Throws RangeError when the seed is not a finite number.
 */
export function createRng(seed: number): Rng {
  if (!Number.isFinite(seed)) throw new RangeError(`seed must be a finite number, got ${seed}`);
  let state = Math.trunc(seed) >>> 0;
  let spare: number | null = null;
  const uniform = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const rng: Rng = {
    uniform,
    between: (lo, hi) => lo + (hi - lo) * uniform(),
    normal: () => {
      if (spare !== null) {
        const value = spare;
        spare = null;
        return value;
      }
      // 1 − u keeps the logarithm's argument in (0, 1].
      const radius = Math.sqrt(-2 * Math.log(1 - uniform()));
      const angle = 2 * Math.PI * uniform();
      spare = radius * Math.sin(angle);
      return radius * Math.cos(angle);
    },
    fork: () => createRng(Math.floor(uniform() * 4294967296)),
  };
  return rng;
}
