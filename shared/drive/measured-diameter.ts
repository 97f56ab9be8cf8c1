/**
 * Pulley diameters as a technician measures them. Calipers across a grooved (ribbed) pulley read
 * the tips of its ribs, which is neither the effective diameter nor the pitch diameter the speed
 * ratio needs; a backside pulley is flat and the belt's pitch (cord) line runs above it, inside
 * the belt. So a measured outside diameter becomes an effective one by adding an offset, one for
 * grooved pulleys and one for backside pulleys, both shop settings:
 *
 *   effective diameter = outside diameter + offset        (millimetres, on the diameter)
 *
 * The defaults are estimates a shop should check against a pulley of known size:
 * - grooved: +2 mm, ISO 9981's nominal "effective line differential" of 2 mm for the PK profile,
 *   taken on the diameter (docs/references.md §5, read through a secondary copy; whether the 2 mm is
 *   per side is not settled there, which would make the offset 4 mm);
 * - backside: +3 mm, twice an assumed 1.5 mm from the belt's back to its cord line (from memory,
 *   not from a standard).
 */

/** Default offset for grooved pulleys (mm on the diameter); estimated, see the module comment. */
export const DEFAULT_GROOVED_OFFSET_MM = 2;
/** Default offset for backside (flat) pulleys (mm on the diameter); estimated, see the module comment. */
export const DEFAULT_BACKSIDE_OFFSET_MM = 3;

/** What each default rests on, in words a shop can check (shown beside the settings). */
export const OFFSET_BASIS = {
  grooved: "Estimated — check against a pulley of known size. Rests on ISO 9981's nominal effective line differential of 2 mm for PK pulleys (docs/references.md §5; whether it is per side is not settled).",
  backside: "Estimated — check against a pulley of known size. Assumes the belt's cord line lies about 1.5 mm under its back (from memory, not a standard).",
} as const;

/** The two offsets a shop sets (mm on the diameter). */
export interface DiameterOffsets {
  groovedOffsetMm: number;
  backsideOffsetMm: number;
}

/** The default offsets. */
export const DEFAULT_OFFSETS: DiameterOffsets = { groovedOffsetMm: DEFAULT_GROOVED_OFFSET_MM, backsideOffsetMm: DEFAULT_BACKSIDE_OFFSET_MM };

/** Removes binary noise from a computed decimal (6.746239999999999 → 6.74624) keeping 12 significant digits. */
export function cleanNumber(v: number): number {
  return Number.isFinite(v) ? Number(v.toPrecision(12)) : v;
}

/**
 * Effective diameter (mm) from a measured outside diameter: outside + the grooved or backside
 * offset. Throws RangeError for a non-positive or non-finite diameter.
 */
export function effectiveFromOutside(outsideMm: number, backside: boolean, offsets: DiameterOffsets): number {
  if (!(Number.isFinite(outsideMm) && outsideMm > 0)) throw new RangeError(`outside diameter must be a positive number of millimetres, got ${outsideMm}`);
  return cleanNumber(outsideMm + (backside ? offsets.backsideOffsetMm : offsets.groovedOffsetMm));
}

/** The outside diameter (mm) a pulley of the given effective diameter would measure: the inverse of `effectiveFromOutside`. */
export function outsideFromEffective(effectiveMm: number, backside: boolean, offsets: DiameterOffsets): number {
  return cleanNumber(effectiveMm - (backside ? offsets.backsideOffsetMm : offsets.groovedOffsetMm));
}

/** Millimetres per inch, exact by definition. */
export const MM_PER_INCH = 25.4;
