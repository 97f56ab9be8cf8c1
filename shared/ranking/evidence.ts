/**
 * The evidence sentence of a ranking entry, in a technician's words, e.g. "Alternator, outer
 * race: 3 harmonics at 10.1, 20.2, 30.3 orders in the envelope, 14 dB above floor; shaft line at
 * 2.61 (1.3 % slip)".
 */
import type { Fault } from '../drive/types';
import type { PatternMatch } from './match-pattern';
import type { SlipEstimate } from './estimate-slip';

const FAULT_WORDS: Record<Fault, string> = {
  shaft: 'shaft (imbalance or misalignment)',
  outer_race: 'outer race',
  inner_race: 'inner race',
  ball: 'ball',
  cage: 'cage',
  belt: 'belt',
};

/** Human name of a fault kind. */
export function faultWords(fault: Fault): string {
  return FAULT_WORDS[fault];
}

const fmt = (order: number): string => (order >= 10 ? order.toFixed(1) : order.toFixed(2));
const plural = (n: number, one: string, many: string): string => `${n} ${n === 1 ? one : many}`;

/** What the evidence needs beside the match. */
export interface EvidenceContext {
  component: string;
  fault: Fault;
  match: PatternMatch;
  slip: SlipEstimate | null;
  approximate: boolean;
  spectrumWord: string;
}

/**
 * Builds the head of the evidence: what was measured (lines, their level, sidebands, other bands,
 * the part's slip). What the score made of it follows from the score's terms
 * (shared/ranking/score-terms.ts), appended by the ranking. Parts are joined with semicolons.
 */
export function evidenceSentence(ctx: EvidenceContext): string {
  const head = `${ctx.component}, ${faultWords(ctx.fault)}`;
  const m = ctx.match;
  const carriers = m.lines.filter((l) => l.line.sideband === 0 && l.found.snrDb >= 6).sort((a, b) => a.line.harmonic - b.line.harmonic);
  if (carriers.length === 0) {
    return `${head}: no line stands 6 dB above the floor in its windows${ctx.approximate ? ' (bearing unknown: approximate orders)' : ''}`;
  }
  const peakDb = Math.max(...carriers.map((l) => l.found.snrDb));
  const orders = carriers.map((l) => fmt(l.found.order)).join(', ');
  const parts: string[] = [];
  const what = carriers.length === 1 ? `1 line at ${orders} orders` : `${carriers.length} harmonics at ${orders} orders`;
  parts.push(`${what} in the ${ctx.spectrumWord}, ${Math.round(peakDb)} dB above floor`);
  const sidebands = m.lines.filter((l) => l.line.sideband !== 0 && l.found.snrDb >= 6);
  if (sidebands.length > 0) {
    const mod = ctx.fault === 'ball' ? 'cage-speed (FTF)' : '1× shaft';
    parts.push(`${plural(sidebands.length, `${mod} sideband`, `${mod} sidebands`)}`);
  }
  if (m.confirmations > 0) parts.push(`also in ${plural(m.confirmations, 'other envelope band', 'other envelope bands')}`);
  if (ctx.slip && ctx.fault !== 'belt') {
    const pct = 100 * ctx.slip.slip;
    parts.push(`shaft line at ${fmt(ctx.slip.line.order)} (${pct.toFixed(1)} % slip)`);
  }
  if (ctx.approximate) parts.push('bearing unknown: orders from a rule of thumb, approximate');
  return `${head}: ${parts.join('; ')}`;
}
