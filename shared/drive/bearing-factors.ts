/**
 * Rolling-element bearing defect factors: multiples of the turning ring's speed.
 *
 * r = (d / D)·cos α; FTF = ½(1 − r) with the inner ring turning, ½(1 + r) with the outer ring
 * turning; BPFO = (n/2)(1 − r); BPFI = (n/2)(1 + r); BSF = (D / 2d)(1 − r²) (ball spin; a ball
 * defect strikes at 2×BSF). Source: R. B. Randall & J. Antoni, "Rolling element bearing
 * diagnostics — A tutorial", MSSP 25(2):485–520, 2011 (docs/references.md §1).
 */
import type { BearingFactors, BearingSpec, RotatingRing } from './types';
import { findBearing, type BearingTable } from './bearing-table';

/** Geometry of one bearing (millimetres or any one length unit; degrees). */
export interface BearingGeometryInput {
  balls: number;
  ballMm: number;
  pitchMm: number;
  contactDeg?: number;
}

/** What `bearingFactors` resolved: the factors, whether they are a rule of thumb, and the turning ring. */
export interface ResolvedBearing {
  factors: BearingFactors;
  /** True when no geometry or factors were known and a stated rule of thumb gave them. */
  approximate: boolean;
  rotatingRing: RotatingRing;
  /** How the factors were obtained, for evidence and the drive table. */
  basis: 'factors' | 'geometry' | 'designation' | 'rule-of-thumb';
}

/**
 * Defect factors from geometry for the given turning ring.
 * Throws RangeError for geometry that cannot be a bearing (d ≥ D, n < 1, |α| ≥ 90°).
 */
export function factorsFromGeometry(geometry: BearingGeometryInput, rotatingRing: RotatingRing = 'inner'): BearingFactors {
  const { balls, ballMm, pitchMm } = geometry;
  const contactDeg = geometry.contactDeg ?? 0;
  if (!(Number.isFinite(balls) && balls >= 1)) throw new RangeError(`ball count must be at least 1, got ${balls}`);
  if (!(ballMm > 0 && pitchMm > 0 && ballMm < pitchMm)) {
    throw new RangeError(`ball diameter must be positive and smaller than the pitch diameter, got d ${ballMm}, D ${pitchMm}`);
  }
  if (!(Math.abs(contactDeg) < 90)) throw new RangeError(`contact angle must be below 90°, got ${contactDeg}`);
  const r = (ballMm / pitchMm) * Math.cos((contactDeg * Math.PI) / 180);
  return {
    ftf: rotatingRing === 'outer' ? 0.5 * (1 + r) : 0.5 * (1 - r),
    bpfo: (balls / 2) * (1 - r),
    bpfi: (balls / 2) * (1 + r),
    bsf: (pitchMm / (2 * ballMm)) * (1 - r * r),
  };
}

/**
 * The rule of thumb for an unknown bearing: the published 6203 geometry (8 balls, d/D ≈ 0.237),
 * the commonest deep-groove size in small accessory pulleys [practice]. It gives BPFO ≈ 0.38·n and
 * BPFI ≈ 0.62·n, close to the trade's "BPFO ≈ 0.4·n, BPFI ≈ 0.6·n". Candidates from it are approximate.
 */
export const RULE_OF_THUMB_DESIGNATION = '6203';

/**
 * Resolves a component's bearing to defect factors (multiples of the turning ring's speed):
 * entered factors are used as given; otherwise geometry, or a designation looked up in the shop's
 * table and then the built-in rows; otherwise the rule of thumb above, marked approximate.
 * The turning ring defaults to the inner ring (shaft-driven parts).
 */
export function bearingFactors(spec: BearingSpec | undefined, shopTable?: BearingTable): ResolvedBearing {
  const rotatingRing: RotatingRing = spec?.rotatingRing ?? 'inner';
  if (spec?.factors) return { factors: { ...spec.factors }, approximate: false, rotatingRing, basis: 'factors' };
  if (spec && spec.balls !== undefined && spec.ballMm !== undefined && spec.pitchMm !== undefined) {
    const geometry = { balls: spec.balls, ballMm: spec.ballMm, pitchMm: spec.pitchMm, contactDeg: spec.contactDeg ?? 0 };
    return { factors: factorsFromGeometry(geometry, rotatingRing), approximate: false, rotatingRing, basis: 'geometry' };
  }
  if (spec?.designation) {
    const row = findBearing(spec.designation, shopTable);
    if (row) {
      return { factors: factorsFromGeometry(row, rotatingRing), approximate: row.source === 'estimated', rotatingRing, basis: 'designation' };
    }
  }
  const fallback = findBearing(RULE_OF_THUMB_DESIGNATION);
  if (!fallback) throw new Error(`built-in bearing table lacks ${RULE_OF_THUMB_DESIGNATION}`);
  return { factors: factorsFromGeometry(fallback, rotatingRing), approximate: true, rotatingRing, basis: 'rule-of-thumb' };
}
