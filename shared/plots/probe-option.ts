/**
 * Probe-point comparison (issue 16 item 4): for each suspect, its strongest matched line at every
 * before-repair probe point, as bars, so the noise can be seen growing toward its source. Captures
 * whose pickups share a unit are compared in that unit; where units differ, each value is given in
 * dB relative to that capture's firing-order line (the engine's own strongest line, present at
 * every probe point), and the chart says so.
 */
import type { EChartsOption } from 'echarts';
import type { Peak } from '../analysis/types';
import type { FindingDto } from '../schemas/analyses';
import { partColor, PLOT_COLORS, PLOT_MONO, PLOT_SANS } from './palette';

/** One before-repair capture as the comparison needs it. */
export interface ProbeCapture {
  captureId: number;
  probePoint: string;
  unit: string;
  /** Peaks of its order spectrum (for the firing-order line). */
  orderPeaks: readonly Peak[];
}

/** The comparison's data: one value per (suspect, probe point), null where the line was not found. */
export interface ProbeComparison {
  mode: 'absolute' | 'relative';
  unit: string;
  probePoints: string[];
  suspects: { name: string; values: (number | null)[] }[];
  note: string;
}

function firingLine(peaks: readonly Peak[]): number | null {
  let best: Peak | null = null;
  for (const p of peaks) if (p.firing && (best === null || p.amplitude > best.amplitude)) best = p;
  return best ? best.amplitude : null;
}

/** Builds the comparison for the given suspects over the before-repair captures. */
export function probeComparison(findings: readonly Pick<FindingDto, 'component' | 'fault' | 'captures'>[], captures: readonly ProbeCapture[]): ProbeComparison {
  const units = new Set(captures.map((c) => c.unit));
  const mode: ProbeComparison['mode'] = units.size <= 1 ? 'absolute' : 'relative';
  const unit = mode === 'absolute' ? [...units][0] ?? '' : 'dB re firing-order line';
  const suspects = findings.map((f) => ({
    name: `${f.component} (${f.fault.replace('_', ' ')})`,
    values: captures.map((cap) => {
      const entry = f.captures.find((x) => x.captureId === cap.captureId);
      if (!entry || entry.lines.length === 0) return null;
      const amp = Math.max(...entry.lines.map((l) => l.amplitude));
      if (mode === 'absolute') return amp;
      const ref = firingLine(cap.orderPeaks);
      return ref && ref > 0 && amp > 0 ? 20 * Math.log10(amp / ref) : null;
    }),
  }));
  return {
    mode, unit, probePoints: captures.map((c) => c.probePoint), suspects,
    note: mode === 'absolute'
      ? `Strongest matched line of each suspect, in ${unit}; all captures share that unit.`
      : 'The captures use different sensor units, so each bar is the suspect\u2019s strongest line in dB relative to that capture\u2019s firing-order line.',
  };
}

/** The echarts option of the comparison (grouped bars). */
export function probeOption(c: ProbeComparison): EChartsOption {
  return {
    backgroundColor: PLOT_COLORS.surface,
    animation: false,
    textStyle: { fontFamily: PLOT_SANS, color: PLOT_COLORS.text },
    legend: { top: 4, left: 64, textStyle: { color: PLOT_COLORS.text } },
    grid: { left: 72, right: 24, top: 44, bottom: 56 },
    tooltip: { trigger: 'axis', backgroundColor: '#0d1117', borderColor: PLOT_COLORS.grid, textStyle: { color: PLOT_COLORS.text, fontFamily: PLOT_MONO, fontSize: 13 } },
    xAxis: { type: 'category', data: c.probePoints, axisLabel: { color: PLOT_COLORS.text, fontSize: 12, interval: 0 }, axisLine: { lineStyle: { color: PLOT_COLORS.grid } } },
    yAxis: { type: 'value', name: c.unit, nameTextStyle: { color: PLOT_COLORS.mutedText, align: 'left' }, axisLabel: { color: PLOT_COLORS.text, fontFamily: PLOT_MONO }, splitLine: { lineStyle: { color: PLOT_COLORS.grid } } },
    series: c.suspects.map((s, i) => ({ type: 'bar', name: s.name, data: s.values, itemStyle: { color: partColor(i) } })),
  };
}
