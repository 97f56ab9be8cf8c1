import { type AnalysisResult, type Peak } from '../../shared/analysis/types';

/** The short human summary `analyze` prints without --json. */
export function formatSummary(r: AnalysisResult, name: string): string {
  const lines: string[] = [];
  const s = r.speed;
  lines.push(`${name}: ${r.capture.durationS.toFixed(2)} s, ${(r.capture.sampleRateHz / 1000).toFixed(3)} kHz, ${r.capture.channels} channel${r.capture.channels === 1 ? '' : 's'}`);
  const how = s.fromPickup
    ? `read from the pickup (firing order ${s.fromPickup.firingOrder} assumed, line ${s.fromPickup.lineDb.toFixed(0)} dB over floor, confidence ${s.fromPickup.confidence.toFixed(2)})`
    : `${s.edges} edges, ${s.repairedEdges} repaired${s.gaps ? `, ${s.gaps} wheel gaps` : ''}`;
  lines.push(`speed     ${s.meanRpm.toFixed(1)} rpm (per revolution ${s.minRpm.toFixed(1)}–${s.maxRpm.toFixed(1)}, stability ${s.stabilityPct.toFixed(2)} %), ${how}`);
  const fmt = (p: Peak) => `${p.order.toFixed(3)}${p.engineOrder !== null ? (p.firing ? '(F)' : '(E)') : ''} ${p.amplitude.toPrecision(3)} ${p.snrDb.toFixed(1)} dB`;
  lines.push(`orders    resolution ${r.orders.spectrum.resolution} up to ${r.orders.spectrum.maxOrder}; strongest: ${r.orders.peaks.slice(0, 6).map(fmt).join(' · ') || 'none'}`);
  lines.push(`envelope  ${r.envelope.bandHz[0].toFixed(0)}–${r.envelope.bandHz[1].toFixed(0)} Hz (${r.envelope.bandChoice}); strongest: ${r.envelope.peaks.slice(0, 6).map(fmt).join(' · ') || 'none'}`);
  const e = r.cycle.event;
  if (r.cycle.available === false) lines.push('cycle     unavailable: no reference, so the 720° phase is unknown');
  else lines.push(`cycle     ${r.cycle.cyclesAveraged} cycles averaged; ${e
    ? `strongest event at ${e.angleDeg.toFixed(0)}° — ${e.cylinder !== null ? `in cylinder ${e.cylinder}'s firing slot` : `in the slot of cylinder ${e.candidates.join(' or ')} (phase unresolved)`}, ${e.afterTdcDeg.toFixed(0)}° after its TDC`
    : 'no impulsive event stands out'}`);
  if (r.ranking.length > 0) {
    lines.push('suspects');
    for (const x of r.ranking.slice(0, 5)) lines.push(`  ${x.score.toFixed(2)}  ${x.component} / ${x.fault} at order ${x.order.toFixed(3)} — ${x.evidence}`);
  }
  for (const w of r.warnings) lines.push(`warning   ${w.message}`);
  lines.push('(E) engine order, (F) firing order; F = (E) multiple of cylinders/2 — add --json for everything');
  return `${lines.join('\n')}\n`;
}
