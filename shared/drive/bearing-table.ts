/**
 * Built-in bearing geometry by designation. Published rows come from the Case Western Reserve
 * University Bearing Data Center's "Bearing Information" table (docs/references.md §1), converted from
 * inches at exactly 25.4 mm/in. Rows marked `estimated` are typical deep-groove geometry for the
 * series, not read from a catalogue: they give approximate defect orders and say so.
 */

/** One bearing designation's geometry (millimetres, degrees). */
export interface BearingGeometry {
  designation: string;
  balls: number;
  ballMm: number;
  pitchMm: number;
  contactDeg: number;
  /** published = a source states it; measured = taken from a part; estimated = typical, not sourced. */
  source: 'published' | 'measured' | 'estimated';
  /** Where the row comes from, in words a shop can check. */
  note: string;
}

const INCH_MM = 25.4;

/** The built-in rows, keyed by upper-case designation. The shop's own table (Drive library) overrides them. */
export const BUILT_IN_BEARINGS: readonly BearingGeometry[] = [
  {
    designation: '6205',
    balls: 9,
    ballMm: 0.3126 * INCH_MM,
    pitchMm: 1.537 * INCH_MM,
    contactDeg: 0,
    source: 'published',
    note: 'CWRU Bearing Data Center, drive-end 6205-2RS (d 0.3126 in, D 1.537 in, 9 balls)',
  },
  {
    designation: '6203',
    balls: 8,
    ballMm: 0.2656 * INCH_MM,
    pitchMm: 1.122 * INCH_MM,
    contactDeg: 0,
    source: 'published',
    note: 'CWRU Bearing Data Center, fan-end 6203-2RS (d 0.2656 in, D 1.122 in, 8 balls)',
  },
  {
    designation: '6204',
    balls: 8,
    ballMm: 7.938,
    pitchMm: 33.5,
    contactDeg: 0,
    source: 'estimated',
    note: 'typical 6204 geometry (8 balls of 5/16 in on the mean of bore and outside diameter); not from a catalogue',
  },
  {
    designation: '6202',
    balls: 8,
    ballMm: 5.953,
    pitchMm: 25.0,
    contactDeg: 0,
    source: 'estimated',
    note: 'typical 6202 geometry (8 balls of 15/64 in on the mean of bore and outside diameter); not from a catalogue',
  },
];

/** A lookup of designation → geometry (the shop's own table, or any other). Keys are matched case-insensitively. */
export type BearingTable = ReadonlyMap<string, BearingGeometry> | readonly BearingGeometry[];

/** Normalises a designation for lookup: upper case, suffixes such as "-2RS" or " ZZ" dropped. */
export function normaliseDesignation(designation: string): string {
  return designation.trim().toUpperCase().replace(/[\s-]*(2RS1?|2RSH|2Z|ZZ|RS|Z|C3)$/g, '').trim();
}

/**
 * Finds a designation in the shop's table first, then in the built-in rows.
 * Returns undefined when neither holds it.
 */
export function findBearing(designation: string, shopTable?: BearingTable): BearingGeometry | undefined {
  const key = normaliseDesignation(designation);
  const search = (table: BearingTable | undefined): BearingGeometry | undefined => {
    if (!table) return undefined;
    const rows = Array.isArray(table) ? table : [...(table as ReadonlyMap<string, BearingGeometry>).values()];
    return (rows as readonly BearingGeometry[]).find((row) => normaliseDesignation(row.designation) === key);
  };
  return search(shopTable) ?? search(BUILT_IN_BEARINGS);
}
