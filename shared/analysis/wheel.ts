import { median } from '../dsp/stats';
import { type Warning } from './types';

/**
 * Trigger-wheel angles (docs/references.md §5 [common practice]): a "N-M" wheel has N tooth positions
 * on a 360/N° pitch with M teeth missing, so the gap interval spans M + 1 pitches (60-2: 18° =
 * 3 pitches). An interval of M + 1 running-median tooth intervals (within half a pitch) is
 * gap-like; a run of M missed teeth looks the same, so a gap-like interval is the gap only when
 * another recurs one revolution away (a missed tooth can no longer be taken for the first gap and
 * lock the real ones out). The gap is counted as its missing pitches, never repaired as missed
 * teeth. Angle 0 is the first tooth after the first gap; each gap re-anchors the tooth index to a
 * whole revolution, so one miscounted revolution does not shift the rest.
 */
export interface WheelAngles {
  times: Float64Array;
  anglesDeg: Float64Array;
  edges: number;
  repaired: number;
  gaps: number;
  warnings: Warning[];
}

/** Fewer samples than this between teeth at the highest speed, and teeth go missing. */
const MIN_SAMPLES_PER_TOOTH = 6;

/**
 * Angles of wheel teeth from their edge times (samples). `sampleRateHz` only words the warning
 * when teeth were missed because they came too few samples apart.
 */
export function wheelAngles(raw: number[], teeth: number, missing: number, sampleRateHz?: number): WheelAngles {
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
  // Pitches of every interval: a gap-like interval spans missing + 1 pitches whether it is the gap
  // or a run of missed teeth, so the pitch count (and the angle) never depends on which it is.
  const ratio = dd.map((v, i) => v / nm[i]);
  const gapLike = ratio.map((r) => Math.abs(r - (missing + 1)) < 0.5);
  const pitches = ratio.map((r, i) => (gapLike[i] ? missing + 1 : Math.max(1, Math.round(r))));
  const start: number[] = new Array(pitches.length);
  for (let i = 0, c = 0; i < pitches.length; i++) { start[i] = c; c += pitches[i]; }
  // The gap is the gap-like interval that recurs one revolution (teeth pitches) earlier or later:
  // a run of as many missed teeth as the wheel lacks looks the same, but does not recur on the
  // revolution. A lone gap-like interval counts only when the capture holds no chain (too short).
  const gapStarts = new Set(start.filter((_, i) => gapLike[i]));
  const chained = (i: number) => gapStarts.has(start[i] + teeth) || gapStarts.has(start[i] - teeth);
  const anyChain = start.some((_, i) => gapLike[i] && chained(i));
  let gaps = 0;
  let repaired = removed;
  let lastGap = -1;
  let miscount = 0;
  let firstGapEnd = -1;
  const gapEnds = new Set<number>();
  for (let i = 0; i < pitches.length; i++) {
    const isGap = gapLike[i] && (chained(i) || (!anyChain && firstGapEnd < 0));
    if (isGap) {
      if (lastGap >= 0 && start[i] - lastGap !== teeth) miscount++;
      gaps++;
      if (firstGapEnd < 0) firstGapEnd = i + 1;
      gapEnds.add(i + 1);
      lastGap = start[i];
    } else if (pitches[i] > 1) {
      repaired += pitches[i] - 1;
    }
  }
  // Teeth only a few samples apart are missed (the trigger cannot re-arm between them); they are
  // counted from the spacing, but the capture should say why and what sample rate would do.
  const perPitch = dd.map((v, i) => v / pitches[i]).filter((_, i) => !gapLike[i]).sort((a, b) => a - b);
  const fastest = perPitch.length > 0 ? perPitch[Math.floor(0.02 * (perPitch.length - 1))] : Infinity;
  const undersampled = repaired > 0.01 * t.length && fastest < MIN_SAMPLES_PER_TOOTH;
  if (undersampled) {
    const need = sampleRateHz ? ` (at least ${Math.ceil((sampleRateHz * MIN_SAMPLES_PER_TOOTH) / fastest / 1000)} kHz)` : '';
    warnings.push({
      code: 'reference_undersampled',
      message: `${repaired} wheel teeth were missed and counted from the spacing: at the highest speed the teeth are only ${fastest.toFixed(1)} samples apart; record the reference at a higher sample rate${need}`,
    });
  } else if (miscount > 0) warnings.push({ code: 'wheel_count', message: `${miscount} revolution${miscount === 1 ? '' : 's'} of the wheel did not count ${teeth} pitches; check --wheel` });
  // Tooth index from the last gap: every gap sets the angle anew to a whole number of revolutions,
  // so a revolution that miscounted its teeth (missed teeth at a low sample rate) does not shift
  // the angle of every later tooth.
  const cum = new Float64Array(t.length);
  for (let i = 1; i < t.length; i++) cum[i] = cum[i - 1] + pitches[i - 1];
  const zero = firstGapEnd >= 0 ? cum[firstGapEnd] : 0;
  const pitchDeg = 360 / teeth;
  const angles = new Float64Array(t.length);
  let anchorCum = zero;
  let anchorPitches = 0;
  for (let i = 0; i < t.length; i++) {
    if (i > firstGapEnd && firstGapEnd >= 0 && gapEnds.has(i)) {
      anchorPitches += teeth * Math.max(1, Math.round((cum[i] - anchorCum) / teeth));
      anchorCum = cum[i];
    }
    angles[i] = (anchorPitches + cum[i] - anchorCum) * pitchDeg;
  }
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
