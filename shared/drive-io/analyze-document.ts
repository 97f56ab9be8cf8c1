/**
 * The JSON export of an engine: the drive document that `analyze --drive` reads. A shop may name
 * its own bearing designations (its BearingType table), which the command line does not know, so
 * the export writes every designated bearing's geometry (balls, ballMm, pitchMm, contactDeg) and
 * its source (published / measured / estimated) beside the designation, which it keeps for the
 * reader (geometry wins over a designation in the kinematics). Numbers are written as entered,
 * without binary noise (6.74624, not 6.746239999999999). Bearings given by geometry or by factors
 * pass through.
 */
import type { BearingSpec, ComponentSpec, DriveDocument } from '../drive/types';
import { normaliseDesignation } from '../drive/bearing-table';
import { cleanNumber } from '../drive/measured-diameter';

/** Geometry of one bearing designation, as the shop's BearingType table holds it. */
export interface BearingGeometry {
  balls: number;
  ballMm: number;
  pitchMm: number;
  contactDeg: number;
  source?: 'published' | 'measured' | 'estimated';
}

/** Looks a designation up (case-insensitively, by convention); undefined when unknown. */
export type DesignationLookup = (designation: string) => BearingGeometry | undefined;

/** Thrown when a component names a designation that the lookup does not know. */
export class UnknownDesignationError extends Error {
  constructor(readonly component: string, readonly designation: string) {
    super(`component "${component}" names bearing designation "${designation}", which is not in the bearing table; add it on the Bearings page or give the geometry`);
    this.name = 'UnknownDesignationError';
  }
}

function resolveBearing(c: ComponentSpec, bearing: BearingSpec, lookup: DesignationLookup): BearingSpec {
  const { designation, ...rest } = bearing;
  if (designation === undefined) return bearing;
  // Geometry or factors given beside the designation are what the user measured: keep them.
  const hasGeometry = rest.balls !== undefined && rest.ballMm !== undefined && rest.pitchMm !== undefined;
  if (hasGeometry || rest.factors) return bearing;
  const g = lookup(designation);
  if (!g) throw new UnknownDesignationError(c.name, designation);
  const out: BearingSpec = {
    designation, balls: g.balls, ballMm: cleanNumber(g.ballMm), pitchMm: cleanNumber(g.pitchMm), contactDeg: cleanNumber(g.contactDeg),
  };
  if (rest.rotatingRing) out.rotatingRing = rest.rotatingRing;
  const source = rest.source ?? g.source;
  if (source) out.source = source;
  return out;
}

/**
 * Returns a copy of `doc` in which no bearing depends on a designation: the form written by
 * GET /api/engines/:id/export.json and read by `analyze --drive`. Throws
 * UnknownDesignationError naming the component when a designation cannot be resolved.
 */
export function toAnalyzeDocument(doc: DriveDocument, lookup: DesignationLookup): DriveDocument {
  return {
    ...doc,
    firingOrder: [...doc.firingOrder],
    belts: doc.belts.map((b) => ({ ...b })),
    components: doc.components.map((c) => (c.bearing ? { ...c, bearing: resolveBearing(c, c.bearing, lookup) } : { ...c })),
  };
}

/**
 * A lookup over a list of rows keyed by designation, matched as the drive kinematics match them
 * (`normaliseDesignation`: case-insensitive, seal suffixes such as -2RS dropped).
 */
export function designationLookup(rows: readonly (BearingGeometry & { designation: string })[]): DesignationLookup {
  const byKey = new Map(rows.map((r) => [normaliseDesignation(r.designation), r]));
  return (designation) => {
    const r = byKey.get(normaliseDesignation(designation));
    return r ? { balls: r.balls, ballMm: r.ballMm, pitchMm: r.pitchMm, contactDeg: r.contactDeg, ...(r.source ? { source: r.source } : {}) } : undefined;
  };
}

/** The file name offered for an engine's export, e.g. "demo-1-6-i4.drive.json". */
export function exportFileName(engineName: string, ext: 'drive.json' | 'components.csv' | 'engine.csv'): string {
  const slug = engineName.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '') || 'engine';
  return `${slug}.${ext}`;
}
