/**
 * The Speed view as an echarts option: rpm against time, the reference edges and the repaired
 * ones marked under the trace, and the Listen playhead as a vertical line.
 */
import type { EChartsOption, SeriesOption } from 'echarts';
import { PLOT_COLORS, PLOT_MONO, PLOT_SANS } from './palette';

/** What the Speed view draws. */
export interface SpeedPlotInput {
  timeS: ArrayLike<number>;
  rpm: ArrayLike<number>;
  /** Times of the reference edges used (s), when the analysis serves them. */
  edgesS?: ArrayLike<number> | null;
  /** Times of the repaired (inserted) edges (s). */
  repairedEdgesS?: ArrayLike<number> | null;
  /** Listen playhead (s), or null when not playing. */
  playheadS?: number | null;
}

function pairs(x: ArrayLike<number>, y: ArrayLike<number>): [number, number][] {
  const n = Math.min(x.length, y.length);
  const out: [number, number][] = [];
  for (let i = 0; i < n; i += 1) out.push([x[i]!, y[i]!]);
  return out;
}

/** Edge ticks thinned to at most `max` (every k-th) so a long capture stays responsive. */
export function thinTimes(times: ArrayLike<number>, max: number): number[] {
  const step = Math.max(1, Math.ceil(times.length / max));
  const out: number[] = [];
  for (let i = 0; i < times.length; i += step) out.push(times[i]!);
  return out;
}

/** The echarts option of the Speed view. */
export function speedOption(input: SpeedPlotInput): EChartsOption {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < input.rpm.length; i += 1) {
    const v = input.rpm[i]!;
    if (Number.isFinite(v)) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  }
  if (!Number.isFinite(lo)) {
    lo = 0;
    hi = 1000;
  }
  const pad = Math.max(20, (hi - lo) * 0.15);
  const tickY = lo - pad * 0.6;
  const axisText = { color: PLOT_COLORS.text, fontFamily: PLOT_MONO, fontSize: 12 };
  const nameText = { color: PLOT_COLORS.mutedText, fontFamily: PLOT_SANS, fontSize: 12 };
  const series: SeriesOption[] = [
    {
      type: 'line', name: 'rpm', showSymbol: false, symbol: 'none', sampling: 'lttb', data: pairs(input.timeS, input.rpm),
      lineStyle: { width: 1.6, color: PLOT_COLORS.reference }, color: PLOT_COLORS.reference,
      markLine: input.playheadS === null || input.playheadS === undefined ? undefined : {
        symbol: 'none', silent: true, animation: false, lineStyle: { color: PLOT_COLORS.warning, width: 2 },
        label: { show: true, formatter: 'playing', color: PLOT_COLORS.warning, position: 'insideEndTop' },
        data: [{ xAxis: input.playheadS }],
      },
    } as SeriesOption,
  ];
  if (input.edgesS && input.edgesS.length > 0) {
    series.push({
      type: 'scatter', name: 'Reference edges', symbol: 'rect', symbolSize: [1.5, 10], large: true, silent: true,
      itemStyle: { color: PLOT_COLORS.mutedText }, data: thinTimes(input.edgesS, 4000).map((t) => [t, tickY]),
    } as SeriesOption);
  }
  if (input.repairedEdgesS && input.repairedEdgesS.length > 0) {
    series.push({
      type: 'scatter', name: 'Repaired edges', symbol: 'triangle', symbolSize: 11, silent: true,
      itemStyle: { color: PLOT_COLORS.warning }, data: Array.from(input.repairedEdgesS, (t) => [t, tickY]),
    } as SeriesOption);
  }
  return {
    backgroundColor: PLOT_COLORS.surface,
    animation: false,
    textStyle: { fontFamily: PLOT_SANS, color: PLOT_COLORS.text },
    legend: { top: 4, left: 64, textStyle: { color: PLOT_COLORS.text } },
    grid: { left: 64, right: 24, top: 40, bottom: 72 },
    xAxis: { type: 'value', name: 'time (s)', nameLocation: 'middle', nameGap: 26, nameTextStyle: nameText, axisLabel: axisText, splitLine: { lineStyle: { color: PLOT_COLORS.grid } } },
    yAxis: { type: 'value', name: 'rpm', min: Math.floor((lo - pad) / 10) * 10, max: Math.ceil((hi + pad) / 10) * 10, nameTextStyle: nameText, axisLabel: axisText, splitLine: { lineStyle: { color: PLOT_COLORS.grid } } },
    tooltip: {
      trigger: 'axis', backgroundColor: '#0d1117', borderColor: PLOT_COLORS.grid, textStyle: { color: PLOT_COLORS.text, fontFamily: PLOT_MONO, fontSize: 13 },
      formatter: (params: unknown) => {
        const p = (Array.isArray(params) ? params[0] : params) as { value?: [number, number] } | undefined;
        return p?.value ? `${p.value[0].toFixed(2)} s · ${p.value[1].toFixed(0)} rpm` : '';
      },
    },
    dataZoom: [
      { type: 'inside', xAxisIndex: 0, filterMode: 'none' },
      { type: 'slider', xAxisIndex: 0, bottom: 12, height: 22, filterMode: 'none', textStyle: { color: PLOT_COLORS.text }, borderColor: PLOT_COLORS.grid },
    ],
    series,
  };
}

/** CSV rows of the Speed view: time, rpm. */
export function speedCsvRows(input: Pick<SpeedPlotInput, 'timeS' | 'rpm'>): { headers: string[]; rows: number[][] } {
  return { headers: ['time_s', 'rpm'], rows: pairs(input.timeS, input.rpm) };
}
