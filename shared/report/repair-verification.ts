/**
 * Repair verification (issue 16 item 6): the confirmed part's lines after the repair against the
 * same lines before it, in dB (20·log10(after / before), amplitude ratio). A drop of at least 6 dB
 * at the part's main line — the strongest before-repair line — or that line gone into the noise
 * floor lets the lead mark the case verified; a smaller drop needs a note. 6 dB (half the
 * amplitude) is the shop-floor rule this workbench uses, a common practice rather than a standard.
 */
import type { FindingCaptureDto, FindingDto, FindingLineDto } from '../schemas/analyses';

/** Least drop at the main line that verifies a repair without a note (dB). */
export const VERIFY_DROP_DB = 6;

/** One line of the confirmed part, before and after. */
export interface LineChange {
  label: string;
  spectrum: 'orders' | 'envelope';
  nominalOrder: number;
  beforeAmplitude: number;
  beforeSnrDb: number;
  /** null when the line is no longer found (gone into the floor). */
  afterAmplitude: number | null;
  afterSnrDb: number | null;
  /** 20·log10(after / before); null when gone (then at least the before SNR was lost). */
  changeDb: number | null;
  main: boolean;
}

/** The verdict of a before/after comparison. */
export interface RepairVerdict {
  lines: LineChange[];
  /** The main line's drop in dB (positive = quieter), or its before SNR when it is gone. */
  mainDropDb: number | null;
  mainGone: boolean;
  /** Drop ≥ 6 dB or line gone: verify without a note. */
  passes: boolean;
  /** Whether there is an after-repair capture to judge at all. */
  hasAfter: boolean;
  sentence: string;
}

function strongest(lines: readonly FindingLineDto[]): Map<string, FindingLineDto> {
  const out = new Map<string, FindingLineDto>();
  for (const l of lines) {
    const have = out.get(l.label);
    if (!have || l.amplitude > have.amplitude) out.set(l.label, l);
  }
  return out;
}

function capturesOf(finding: Pick<FindingDto, 'captures'>, phase: FindingCaptureDto['phase'], ids?: readonly number[]): FindingCaptureDto[] {
  return finding.captures.filter((c) => c.phase === phase && (!ids || ids.includes(c.captureId)));
}

/**
 * Compares a finding's lines in its after-repair captures with its before-repair captures
 * (optionally only the given capture ids). Each line's before value is its strongest reading over
 * the before captures (the probe point nearest the source), its after value the strongest after.
 */
export function compareRepair(finding: Pick<FindingDto, 'captures' | 'component'>, options: { beforeIds?: number[]; afterIds?: number[] } = {}): RepairVerdict {
  const before = strongest(capturesOf(finding, 'before', options.beforeIds).flatMap((c) => c.lines));
  const afterCaptures = capturesOf(finding, 'after_repair', options.afterIds);
  const after = strongest(afterCaptures.flatMap((c) => c.lines));
  let mainLabel: string | null = null;
  let mainAmp = -Infinity;
  for (const [label, l] of before) {
    if (l.amplitude > mainAmp) {
      mainAmp = l.amplitude;
      mainLabel = label;
    }
  }
  const lines: LineChange[] = [...before.values()]
    .sort((a, b) => a.nominalOrder - b.nominalOrder)
    .map((b) => {
      const a = after.get(b.label) ?? null;
      return {
        label: b.label, spectrum: b.spectrum, nominalOrder: b.nominalOrder, beforeAmplitude: b.amplitude, beforeSnrDb: b.snrDb,
        afterAmplitude: a ? a.amplitude : null, afterSnrDb: a ? a.snrDb : null,
        changeDb: a && b.amplitude > 0 && a.amplitude > 0 ? 20 * Math.log10(a.amplitude / b.amplitude) : null,
        main: b.label === mainLabel,
      };
    });
  const main = lines.find((l) => l.main) ?? null;
  const hasAfter = afterCaptures.length > 0;
  if (!hasAfter || !main) {
    return {
      lines, mainDropDb: null, mainGone: false, passes: false, hasAfter,
      sentence: !hasAfter ? 'Upload an after-repair capture at the same probe point to verify the repair.' : 'No line of this part was measured before the repair.',
    };
  }
  const gone = main.afterAmplitude === null;
  const drop = gone ? main.beforeSnrDb : -(main.changeDb ?? 0);
  const passes = gone || drop >= VERIFY_DROP_DB;
  const what = `${finding.component} ${main.label.replace(/(\d)x/g, '$1×')}`;
  const sentence = gone
    ? `${what} is gone into the noise floor after the repair (it stood ${main.beforeSnrDb.toFixed(0)} dB over the floor before).`
    : drop >= 0
      ? `${what} dropped ${drop.toFixed(1)} dB after the repair${passes ? '' : ` — less than ${VERIFY_DROP_DB} dB: add a note to verify`}.`
      : `${what} rose ${(-drop).toFixed(1)} dB after the repair — check the probe point and the part replaced; add a note to verify anyway.`;
  return { lines, mainDropDb: drop, mainGone: gone, passes, hasAfter, sentence };
}
