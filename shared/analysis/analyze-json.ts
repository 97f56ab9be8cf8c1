import { type AnalysisResult, type Peak } from './types';

/**
 * The `analyze --json` object (docs/analyze-json.md gives every field; issue 20 adds speed.source,
 * speed.fromPickup and cycle.available only when speed was read from the pickup), exactly: capture, settings, speed, orders, envelope,
 * cycle, ranking, warnings, timingsMs — typed arrays and internal fields left out, numbers
 * rounded to what the measurement supports.
 */
export function toAnalyzeJson(r: AnalysisResult): Record<string, unknown> {
  const peak = (p: Peak) => ({ order: rnd(p.order, 4), amplitude: sig(p.amplitude, 5), snrDb: rnd(p.snrDb, 2), engineOrder: p.engineOrder, firing: p.firing });
  const ms = (v: number) => rnd(v, 1);
  const e = r.cycle.event;
  return {
    capture: { sampleRateHz: rnd(r.capture.sampleRateHz, 3), durationS: rnd(r.capture.durationS, 4), channels: r.capture.channels },
    settings: r.settings,
    speed: {
      meanRpm: rnd(r.speed.meanRpm, 2), minRpm: rnd(r.speed.minRpm, 2), maxRpm: rnd(r.speed.maxRpm, 2),
      stabilityPct: rnd(r.speed.stabilityPct, 3), edges: r.speed.edges, repairedEdges: r.speed.repairedEdges,
      // Added by issue 20, only when speed came from the pickup (a reference capture's JSON is unchanged).
      ...(r.speed.fromPickup ? {
        source: 'pickup',
        fromPickup: {
          firingOrder: r.speed.fromPickup.firingOrder, confidence: r.speed.fromPickup.confidence, lineDb: rnd(r.speed.fromPickup.lineDb, 1),
          presentFraction: rnd(r.speed.fromPickup.presentFraction, 3), marginDb: rnd(r.speed.fromPickup.marginDb, 1),
        },
      } : {}),
    },
    orders: {
      resolution: r.orders.spectrum.resolution, maxOrder: r.orders.spectrum.maxOrder, samplesPerRev: r.orders.spectrum.samplesPerRev,
      peaks: r.orders.peaks.map(peak),
    },
    envelope: { bandHz: r.envelope.bandHz, bandChoice: r.envelope.bandChoice, resolution: r.envelope.resolution, peaks: r.envelope.peaks.map(peak) },
    cycle: {
      tdcOffsetDeg: r.cycle.tdcOffsetDeg, phaseResolved: r.cycle.phaseResolved, ...(r.cycle.available === false ? { available: false } : {}),
      event: e ? { angleDeg: rnd(e.angleDeg, 1), cylinder: e.cylinder, candidates: e.candidates, afterTdcDeg: rnd(e.afterTdcDeg, 1) } : null,
    },
    ranking: r.ranking.map((x) => ({
      component: x.component, target: x.target, fault: x.fault, order: rnd(x.order, 4), nominalOrder: rnd(x.nominalOrder, 4),
      score: rnd(x.score, 3), slipPct: x.slipPct === null ? null : rnd(x.slipPct, 2), evidence: x.evidence, indistinguishableFrom: x.indistinguishableFrom,
    })),
    warnings: r.warnings.map((w) => ({ code: w.code, message: w.message })),
    timingsMs: {
      read: ms(r.timingsMs.read), speed: ms(r.timingsMs.speed), orders: ms(r.timingsMs.orders), envelope: ms(r.timingsMs.envelope),
      cycle: ms(r.timingsMs.cycle), spectrogram: ms(r.timingsMs.spectrogram), peaks: ms(r.timingsMs.peaks), ranking: ms(r.timingsMs.ranking),
      total: ms(r.timingsMs.total),
    },
  };
}

function rnd(v: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(v * f) / f;
}

function sig(v: number, digits: number): number {
  return v === 0 || !Number.isFinite(v) ? v : Number(v.toPrecision(digits));
}
