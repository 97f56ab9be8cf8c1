import { type AnalysisResult, type Peak, type RankingEntry } from '../../shared/analysis/types';

/** Which spectrum a line is read from. */
export type SpectrumKind = 'orders' | 'envelope';

/**
 * Whether a line at `order` in a spectrum fits some part of the drive document (within a candidate
 * line's match window); given only when `analyze` got a drive document.
 */
export type FitsDrive = (order: number, spectrum: SpectrumKind) => boolean;

/** The faults in a technician's words. */
export const FAULT_WORDS: Record<RankingEntry['fault'], string> = {
  shaft: 'shaft (imbalance, misalignment or a worn pulley)',
  outer_race: 'bearing outer race',
  inner_race: 'bearing inner race',
  ball: 'bearing ball',
  cage: 'bearing cage',
  belt: 'belt (a flaw that passes once per belt turn)',
};

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** The first two clauses of an evidence sentence, as one short sentence (--json has it whole). */
export function shortEvidence(evidence: string): string {
  const clauses = evidence.split('; ').filter(Boolean);
  const text = clauses.slice(0, 2).join('; ').replace(/_/g, ' ');
  const head = `${text.charAt(0).toUpperCase()}${text.slice(1)}`;
  return clauses.length > 2 ? `${head} …` : /[.…]$/.test(head) ? head : `${head}.`;
}

/** The amplitude unit of the pickup channel: the file's unit when it names one, else the input's own. */
function pickupUnit(r: AnalysisResult): string {
  const ch = r.settings.pickupChannel - 1;
  const unit = r.capture.channelUnits?.[ch];
  if (unit) return unit;
  if (r.settings.channelScales[ch] !== undefined && r.settings.channelScales[ch] !== 1) return 'scaled units';
  return r.capture.format?.startsWith('wav') ? 'of full scale' : 'input units';
}

function amplitude(value: number, unit: string): string {
  return `${value.toPrecision(3)} ${unit}`;
}

function describePeak(p: Peak, unit: string): string {
  const kind = p.engineOrder === null ? '' : p.firing ? ' (firing order: the engine itself)' : ' (a half-order multiple: often the engine itself)';
  return `order ${p.order.toFixed(2)}, ${amplitude(p.amplitude, unit)}, ${p.snrDb.toFixed(0)} dB above the floor${kind}`;
}

/**
 * The summary `analyze` prints without --json, in a technician's words: what was read, the engine
 * speed, the strongest lines with their amplitude and unit, the suspects with a short reason each,
 * and — with a drive document — whether the strongest lines fit any part of it at all.
 */
export function formatSummary(r: AnalysisResult, name: string, fits?: FitsDrive): string {
  const lines: string[] = [];
  const s = r.speed;
  const unit = pickupUnit(r);
  lines.push(`${name}: ${r.capture.durationS.toFixed(1)} seconds at ${(r.capture.sampleRateHz / 1000).toFixed(1)} kHz, ${plural(r.capture.channels, 'channel')}.`);
  lines.push('');
  lines.push(`Engine speed: ${s.meanRpm.toFixed(0)} rpm on average (from ${s.minRpm.toFixed(0)} to ${s.maxRpm.toFixed(0)} rpm, steady within ${s.stabilityPct.toFixed(1)} %).`);
  if (s.fromPickup) {
    lines.push(`  Read from the pickup itself (no reference): its strongest engine line taken as the firing order ${s.fromPickup.firingOrder}, ${s.fromPickup.lineDb.toFixed(0)} dB above the floor, confidence ${s.fromPickup.confidence.toFixed(2)}. Every order below is relative to that assumption.`);
  } else {
    lines.push(`  Counted ${plural(s.edges, 'reference pulse')}${s.repairedEdges ? `, ${s.repairedEdges} missed or extra pulse${s.repairedEdges === 1 ? '' : 's'} repaired` : ''}${s.gaps ? `, ${plural(s.gaps, 'gap')} of the trigger wheel` : ''}.`);
  }
  lines.push('');
  lines.push(`Strongest lines in the vibration (orders are multiples of crank speed; resolution ${r.orders.spectrum.resolution} order):`);
  const top = r.orders.peaks.slice(0, 5);
  if (top.length === 0) lines.push('  none stands out from the floor.');
  for (const p of top) lines.push(`  ${describePeak(p, unit)}`);
  lines.push(`Strongest lines in the bearing-noise envelope (${r.envelope.bandHz[0].toFixed(0)}–${r.envelope.bandHz[1].toFixed(0)} Hz band, ${r.envelope.bandChoice === 'auto' ? 'chosen automatically' : 'as given'}):`);
  const topEnvelope = r.envelope.peaks.slice(0, 5);
  if (topEnvelope.length === 0) lines.push('  none stands out from the floor.');
  for (const p of topEnvelope) lines.push(`  ${describePeak(p, unit)}`);
  lines.push('');
  const e = r.cycle.event;
  if (r.cycle.available === false) lines.push('Engine cycle: unavailable without a reference (the 720° phase is unknown).');
  else lines.push(`Engine cycle: ${plural(r.cycle.cyclesAveraged, 'cycle')} averaged. ${e
    ? `The strongest knock comes ${e.afterTdcDeg.toFixed(0)}° after TDC ${e.cylinder !== null ? `in cylinder ${e.cylinder}'s firing slot` : `in the slot of cylinder ${e.candidates.join(' or ')} (the reference cannot tell which)`} — the slot says whose power stroke is under way, not where the noise comes from.`
    : 'No knock stands out within the cycle.'}`);
  if (r.ranking.length > 0) {
    lines.push('');
    lines.push('Likely sources, most likely first (score 0 to 1):');
    for (const x of r.ranking.slice(0, 5)) {
      const what = x.target === 'belt' ? `${x.component} (belt)` : `${x.component}: ${FAULT_WORDS[x.fault]}`;
      lines.push(`  ${x.score.toFixed(2)}  ${what}, at order ${x.order.toFixed(2)}${x.approximate ? ' (bearing estimated by rule of thumb)' : ''}.`);
      lines.push(`        ${shortEvidence(x.evidence)}`);
      if (x.indistinguishableFrom.length > 0) lines.push(`        This capture cannot tell it from ${x.indistinguishableFrom.join(', ')}.`);
    }
  }
  if (fits) {
    const strongest = [...top.map((p) => ({ p, spectrum: 'orders' as const })), ...topEnvelope.map((p) => ({ p, spectrum: 'envelope' as const }))]
      .filter(({ p }) => p.engineOrder === null)
      .sort((a, b) => b.p.snrDb - a.p.snrDb);
    const misfit = strongest.find(({ p, spectrum }) => !fits(p.order, spectrum));
    if (misfit && misfit === strongest[0]) {
      lines.push('');
      lines.push(`Note: the strongest line, order ${misfit.p.order.toFixed(2)} at ${misfit.p.snrDb.toFixed(0)} dB${misfit.spectrum === 'envelope' ? ' in the envelope' : ''}, fits no part of this engine: check the engine file or the pulley sizes.`);
    } else if (misfit) {
      lines.push('');
      lines.push(`Note: a strong line, order ${misfit.p.order.toFixed(2)} at ${misfit.p.snrDb.toFixed(0)} dB${misfit.spectrum === 'envelope' ? ' in the envelope' : ''}, fits no part of this engine: check the engine file or the pulley sizes.`);
    }
  } else if (r.ranking.length === 0) {
    lines.push('');
    lines.push('No engine file given (--drive engine.json): lines are not matched to parts.');
  }
  if (r.warnings.length > 0) {
    lines.push('');
    for (const w of r.warnings) lines.push(`Warning: ${w.message}`);
  }
  lines.push('');
  lines.push('Add --json for every number.');
  return `${lines.join('\n')}\n`;
}

/** A settings problem in plain words: "--cylinders must be a whole number of at least 1". */
export function plainOptionError(flag: string, issue: { code?: string; message: string; minimum?: unknown; maximum?: unknown; origin?: string; expected?: string; inclusive?: boolean }): string {
  const whole = flag === '--cylinders' || flag.endsWith('-channel') || flag === '--ref-per-cycle' || flag === '--samples-per-rev' || flag === '--revs-per-block';
  const kind = whole ? 'a whole number' : 'a number';
  if (issue.code === 'too_small' && typeof issue.minimum === 'number') return `${flag} must be ${kind} of at least ${issue.minimum}`;
  if (issue.code === 'too_big' && typeof issue.maximum === 'number') return `${flag} must be ${kind} of at most ${issue.maximum}`;
  if (issue.code === 'invalid_type' && issue.expected === 'int') return `${flag} must be a whole number`;
  if (issue.code === 'invalid_value' || issue.code === 'invalid_enum_value') return `${flag}: ${issue.message.replace(/^Invalid option: expected one of /, 'must be one of ').replace(/"\|"/g, '", "')}`;
  return `${flag}: ${issue.message}`;
}
