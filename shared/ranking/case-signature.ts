/**
 * Case memory (issue 20 item 4): a case's order signature and the similarity of two signatures.
 * A signature is a fixed-length vector of line levels at the candidate orders of one part (or
 * belt): the level in dB over the running-median floor of the strongest local maximum inside each
 * line's window (shaft and belt lines in the raw order spectrum, bearing lines in the envelope
 * spectra), clipped to 0…40 dB, divided by the level of the firing-order line in the raw spectrum
 * (at least 6 dB), so that a firmer or looser probe contact does not change the pattern much. Over
 * several captures of a case each slot keeps its largest value. Similarity is the normalised
 * distance d = ‖a − b‖ / (‖a‖ + ‖b‖) in 0…1 (0 = same pattern, 1 = nothing in common); similar
 * cases are listed same engine first, then by distance.
 */
import type { OrderSpectrum, RankingInput } from '../analysis/types';
import { candidateLines } from '../drive/candidate-lines';
import type { CandidateLine, DriveDocument } from '../drive/types';
import { lineNear, localMaxima } from './spectrum-lines';

/** The slots of a signature: a part's shaft and bearing lines, then a belt's pass lines. */
export const SIGNATURE_SLOTS = [
  'shaft 1x', 'shaft 2x',
  'BPFO 1x', 'BPFO 2x', 'BPFO 3x', 'BPFI 1x', 'BPFI 2x', 'BPFI 3x',
  '2xBSF 1x', '2xBSF 2x', '2xBSF 3x', 'FTF 1x', 'FTF 2x', 'FTF 3x',
  'belt pass 1x', 'belt pass 2x', 'belt pass 3x',
] as const;

const CLIP_DB = 40;
const MIN_FIRING_DB = 6;
/** Past cases farther than this are not called similar. */
export const MAX_SIMILAR_DISTANCE = 0.6;

function levelIn(spectra: readonly OrderSpectrum[], line: CandidateLine): number {
  let best = 0;
  for (const s of spectra) {
    const [lo, hi] = line.window;
    const found = localMaxima(s, lo - s.resolution, hi + s.resolution)[0];
    if (found) best = Math.max(best, found.snrDb);
  }
  return Math.min(CLIP_DB, Math.max(0, best));
}

/**
 * Signature of one part (or belt, by name) over a case's captures. Throws RangeError when the
 * drive has no such part or belt.
 */
export function caseSignature(drive: DriveDocument, part: string, captures: readonly RankingInput[]): Float64Array {
  const key = part.trim().toLowerCase();
  const cc = candidateLines(drive).find((c) => c.component.trim().toLowerCase() === key);
  if (!cc) throw new RangeError(`no part or belt named "${part}" in drive "${drive.name}"`);
  const out = new Float64Array(SIGNATURE_SLOTS.length);
  for (const input of captures) {
    const firing = lineNear(input.orders, input.cylinders / 2, input.orders.resolution);
    const norm = Math.max(MIN_FIRING_DB, firing ? Math.min(CLIP_DB, firing.snrDb) : 0);
    const envelopes = input.envelopes.map((b) => b.spectrum);
    for (const line of cc.lines) {
      if (line.sideband !== 0) continue;
      const slot = (SIGNATURE_SLOTS as readonly string[]).indexOf(line.label);
      if (slot < 0) continue;
      const v = levelIn(line.spectrum === 'orders' ? [input.orders] : envelopes, line) / norm;
      out[slot] = Math.max(out[slot], v);
    }
  }
  return out;
}

/** Normalised distance ‖a − b‖ / (‖a‖ + ‖b‖): 0 for the same pattern, 1 when nothing is shared (and when both are empty). */
export function signatureDistance(a: ArrayLike<number>, b: ArrayLike<number>): number {
  if (a.length !== b.length) throw new RangeError(`signatures must have the same length, got ${a.length} and ${b.length}`);
  let d = 0, na = 0, nb = 0;
  for (let i = 0; i < a.length; i++) { d += (a[i] - b[i]) ** 2; na += a[i] ** 2; nb += b[i] ** 2; }
  const den = Math.sqrt(na) + Math.sqrt(nb);
  return den > 0 ? Math.sqrt(d) / den : 1;
}

/** A confirmed earlier case of the shop, with the signature stored at confirmation. */
export interface PastCase {
  caseId: string;
  engineId: string;
  /** The confirmed part (or belt) and fault, and the lead's note on the cause. */
  part: string;
  partKind: string;
  fault: string;
  cause: string;
  signature: ArrayLike<number>;
}

export interface SimilarCase extends PastCase {
  distance: number;
  sameEngine: boolean;
}

/**
 * The confirmed earlier cases most alike the current one: for each past case, the current case's
 * signature at that case's confirmed part (by name on the same engine; on another engine the part
 * of that name, else the first of that kind), its distance; those within MAX_SIMILAR_DISTANCE,
 * same engine first, then nearest first; at most `limit` (3).
 */
export function similarCases(current: { engineId: string; drive: DriveDocument; captures: readonly RankingInput[] }, history: readonly PastCase[], limit = 3): SimilarCase[] {
  const cache = new Map<string, Float64Array>();
  const signatureAt = (part: string): Float64Array | null => {
    if (!cache.has(part)) {
      try { cache.set(part, caseSignature(current.drive, part, current.captures)); } catch { return null; }
    }
    return cache.get(part) ?? null;
  };
  const out: SimilarCase[] = [];
  for (const past of history) {
    const sameEngine = past.engineId === current.engineId;
    let part: string | undefined = past.part;
    if (!sameEngine && !current.drive.components.some((c) => c.name.toLowerCase() === past.part.toLowerCase()) && !current.drive.belts.some((b) => b.name.toLowerCase() === past.part.toLowerCase())) {
      part = current.drive.components.find((c) => c.kind === past.partKind)?.name;
    }
    const sig = part ? signatureAt(part) : null;
    if (!sig) continue;
    const distance = signatureDistance(sig, past.signature);
    if (distance <= MAX_SIMILAR_DISTANCE) out.push({ ...past, distance, sameEngine });
  }
  return out.sort((a, b) => Number(b.sameEngine) - Number(a.sameEngine) || a.distance - b.distance || a.caseId.localeCompare(b.caseId)).slice(0, limit);
}
