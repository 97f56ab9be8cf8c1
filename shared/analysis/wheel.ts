import { median } from '../dsp/stats';
import { type Warning } from './types';

/**
 * Trigger-wheel angles (REFERENCES.md §5 [common practice]): a "N-M" wheel has N tooth positions
 * on a 360/N° pitch with M teeth missing, so the gap interval spans M + 1 pitches (60-2: 18° =
 * 3 pitches). The gap is found by the interval ratio to the running median tooth interval
 * (≥ 1 + M/2) and counted as its missing pitches — never repaired as missed teeth. Angle 0 is the
 * first tooth after the first gap; every tooth's angle comes from its index.
 */
export interface WheelAngles {
  times: Float64Array;
  anglesDeg: Float64Array;
  edges: number;
  repaired: number;
  gaps: number;
  warnings: Warning[];
}

/** Angles of wheel teeth from their edge times (samples). */
export function wheelAngles(raw: number[], teeth: number, missing: number): WheelAngles {
  const warnings: Warning[] = [];
  const d: number[] = [];
  for (let i = 1; i < raw.length; i++) d.push(raw[i] - raw[i - 1]);
  const nom = blockMedian(d, teeth);
  // Drop extra pulses: an interval far below the tooth interval.
  const keep: boolean[] = raw.map(() => true);
  let removed = 0;
  for (let i = 0; i < d.length; i++) if (d[i] < 0.5 * nom[i]) { keep[i + 1] = false; removed++; }
  const t = raw.filter((_, i) => keep[i]);
  const dd: number[] = [];
  for (let i = 1; i < t.length; i++) dd.push(t[i] - t[i - 1]);
  const nm = blockMedian(dd, teeth);
  const pitches: number[] = [];
  let gaps = 0;
  let repaired = removed;
  let sinceGap = -1;
  let miscount = 0;
  let firstGapEnd = -1;
  for (let i = 0; i < dd.length; i++) {
    const r = dd[i] / nm[i];
    let p = Math.max(1, Math.round(r));
    const gapLike = r >= 1 + missing / 2 && Math.abs(r - (missing + 1)) <= 0.5 * (missing + 1);
    const countFits = sinceGap < 0 || sinceGap + missing + 1 === teeth;
    if (gapLike && (countFits || missing >= 2)) {
      if (sinceGap >= 0 && sinceGap + missing + 1 !== teeth) miscount++;
      p = missing + 1;
      gaps++;
      if (firstGapEnd < 0) firstGapEnd = i + 1;
      sinceGap = 0;
    } else {
      if (p > 1) repaired += p - 1;
      if (sinceGap >= 0) sinceGap += p;
    }
    pitches.push(p);
  }
  if (miscount > 0) warnings.push({ code: 'wheel_count', message: `${miscount} revolution${miscount === 1 ? '' : 's'} of the wheel did not count ${teeth} pitches; check --wheel` });
  const cum = new Float64Array(t.length);
  for (let i = 1; i < t.length; i++) cum[i] = cum[i - 1] + pitches[i - 1];
  const zero = firstGapEnd >= 0 ? cum[firstGapEnd] : 0;
  const pitchDeg = 360 / teeth;
  const angles = new Float64Array(t.length);
  for (let i = 0; i < t.length; i++) angles[i] = (cum[i] - zero) * pitchDeg;
  return { times: Float64Array.from(t), anglesDeg: angles, edges: t.length, repaired, gaps, warnings };
}

/** Median of each block of about one revolution's intervals, assigned to the block's intervals. */
function blockMedian(d: number[], teeth: number): number[] {
  const out: number[] = new Array(d.length);
  const block = Math.max(8, teeth);
  for (let s = 0; s < d.length; s += block) {
    const e = Math.min(d.length, s + block);
    const a = e - s < block / 2 && s > 0 ? Math.max(0, e - block) : s;
    const m = median(d.slice(a, e));
    for (let i = s; i < e; i++) out[i] = m;
  }
  return out;
}
