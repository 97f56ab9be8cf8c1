/**
 * Which suspects a capture cannot tell apart: two parts whose WHOLE line patterns for a fault
 * coincide (every harmonic, sideband and shaft line within a bin or 0.5 % of each other), e.g.
 * two idlers of the same diameter and bearing on one belt. One shared window is common and does
 * not count (docs/design.md "Ranking suspects").
 */
import type { CandidateLine, ComponentCandidates, Fault } from '../drive/types';

function close(a: number, b: number, resolution: number): boolean {
  return Math.abs(a - b) <= Math.max(resolution, 0.005 * Math.max(a, b));
}

/** Lines that make up a fault's pattern: its carriers and sidebands, plus the part's shaft 1×. */
export function patternLines(candidates: ComponentCandidates, fault: Fault): CandidateLine[] {
  return candidates.lines.filter((l) => l.fault === fault || (l.fault === 'shaft' && l.harmonic === 1));
}

/**
 * Whether the two parts' patterns for a fault (and for `otherFault` on the second part, default
 * the same fault) coincide line for line within the resolution (or 0.5 %), up to `maxOrder`.
 */
export function patternsCoincide(
  a: ComponentCandidates, b: ComponentCandidates, fault: Fault, resolution: number, maxOrder: number, otherFault: Fault = fault,
): boolean {
  const la = patternLines(a, fault).filter((l) => l.nominalOrder <= maxOrder);
  const lb = patternLines(b, otherFault).filter((l) => l.nominalOrder <= maxOrder);
  if (la.length === 0 || la.length !== lb.length) return false;
  const covered = (xs: CandidateLine[], ys: CandidateLine[]) => xs.every((x) => ys.some((y) => close(x.nominalOrder, y.nominalOrder, resolution)));
  return covered(la, lb) && covered(lb, la);
}

/** What would separate two parts the capture cannot tell apart, for the evidence sentence. */
export function separationAdvice(names: string[]): string {
  return `cannot be told from ${names.join(', ')} by this capture (same ratio and bearing): probe nearer each part, or take the belt off and spin each by hand`;
}
