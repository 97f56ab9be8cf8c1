/**
 * The Orders view as an echarts option: the raw order spectrum above, the envelope spectrum below
 * on a shared order axis, each part of the case's engine its own colour, marker and slip-window
 * band (approximate candidates dashed and lighter), engine-synchronous orders shaded and the firing
 * orders labelled as likely engine vibration. The same builder serves the browser (with hover and
 * zoom) and the server's SVG for the report PDF (`forExport`).
 */
import type { EChartsOption, MarkAreaComponentOption, MarkLineComponentOption, SeriesOption } from 'echarts';
import type { Peak } from '../analysis/types';
import type { ComponentCandidates } from '../drive/types';
import { engineOrders, linesOf, nearestCandidate, type PartLine } from './candidates';
import { partColor, PLOT_COLORS, PLOT_MONO, PLOT_SANS } from './palette';
import { lastOrder, spectrumPoints, type SpectrumData } from './spectrum-data';

/** What the Orders view draws. */
export interface OrdersPlotInput {
  orders: SpectrumData & { peaks?: readonly Peak[] };
  /** The envelope spectrum of the reported band (bearing lines); omitted when the analysis has none. */
  envelope?: (SpectrumData & { peaks?: readonly Peak[]; bandHz?: [number, number] }) | null;
  /** Candidate lines of the case's engine (shared/drive/candidate-lines.ts), one entry per part and belt. */
  candidates: readonly ComponentCandidates[];
  cylinders: number;
  scale: 'linear' | 'db';
  /** Amplitude unit after the channel scale, e.g. "g" or "V". */
  unit: string;
  /** The part whose every line (harmonics and sidebands) is drawn; others show their main lines. */
  focus?: string | null;
  /** Highest order shown at first (zoom in or out from there); default from the candidates. */
  viewMaxOrder?: number;
  /** Server-side SVG for the report: no zoom slider, no tooltip, fixed size fonts. */
  forExport?: boolean;
}

const SHORT_FAULT: Record<string, string> = { shaft: '', belt: '' };

function markerLabel(pl: PartLine): string {
  const l = pl.line.label.replace(/(\d)x/g, '$1×').replace(/\bshaft\b/, '').trim();
  return `${pl.component}${SHORT_FAULT[pl.line.fault] ?? ''} ${l}`.trim();
}

/** Lines drawn for a part: its main lines always, everything for the focused part. */
function drawn(pl: PartLine, spectrum: 'orders' | 'envelope', focus: string | null | undefined, exportMode = false): boolean {
  if (pl.component === focus) return !exportMode || pl.line.sideband === 0;
  if (spectrum === 'orders') return pl.line.harmonic >= 1 && pl.line.harmonic <= 2 && pl.line.sideband === 0;
  return pl.line.harmonic === 1 && pl.line.sideband === 0;
}

/** The order shown at the right edge at first: a little past the focused part's (or every part's) main lines. */
export function defaultViewMaxOrder(input: Pick<OrdersPlotInput, 'candidates' | 'focus' | 'orders'>): number {
  const maxAvailable = lastOrder(input.orders);
  let top = 0;
  for (const c of input.candidates) {
    if (input.focus && c.component !== input.focus) continue;
    for (const l of c.lines) if (l.sideband === 0 && (l.harmonic <= 2 || c.component === input.focus)) top = Math.max(top, l.nominalOrder);
  }
  const want = top > 0 ? top * 1.12 : 12;
  return Math.min(Math.max(want, 8), maxAvailable > 0 ? maxAvailable : want);
}

function partSeries(
  pl: readonly PartLine[], index: number, name: string, axis: number, spectrum: 'orders' | 'envelope',
  focus: string | null | undefined, pad: number, exportMode: boolean,
): SeriesOption {
  const color = partColor(index);
  const lines = pl.filter((x) => drawn(x, spectrum, focus, exportMode));
  const approximate = pl[0]?.approximate ?? false;
  const markLine: MarkLineComponentOption = {
    symbol: 'none',
    silent: true,
    animation: false,
    label: {
      show: true, position: 'insideEndTop', color, fontFamily: PLOT_SANS, fontSize: exportMode ? 9 : 11,
      formatter: (p: { name?: string }) => p.name ?? '',
    },
    lineStyle: { color, width: 1.2, type: approximate ? 'dashed' : 'solid', opacity: approximate ? 0.55 : 0.95 },
    // Sidebands are drawn but not labelled: their carrier's label names them.
    data: lines.map((x) => ({ name: markerLabel(x), xAxis: x.line.nominalOrder, label: { show: x.line.sideband === 0 } })),
  };
  const markArea: MarkAreaComponentOption = {
    silent: true,
    animation: false,
    itemStyle: { color, opacity: approximate ? 0.07 : 0.14 },
    data: lines.map((x) => [{ xAxis: x.line.window[0] - pad }, { xAxis: x.line.window[1] + pad }]) as MarkAreaComponentOption['data'],
  };
  return { type: 'line', name, xAxisIndex: axis, yAxisIndex: axis, data: [], color, symbol: 'none', markLine, markArea } as SeriesOption;
}

function engineSeries(maxOrder: number, cylinders: number, resolution: number, axis: number, exportMode: boolean): SeriesOption {
  const half = Math.max(resolution, 0.02);
  let labelled = 0;
  const data = engineOrders(maxOrder, cylinders).map((e) => [
    {
      xAxis: e.order - half,
      // The first few firing orders carry the word; the shading says the rest.
      name: e.firing && (labelled += 1) <= 3 ? 'engine' : '',
      itemStyle: { color: e.firing ? PLOT_COLORS.firingBand : PLOT_COLORS.engineBand },
    },
    { xAxis: e.order + half },
  ]);
  return {
    type: 'line', name: 'Engine orders (likely engine vibration)', xAxisIndex: axis, yAxisIndex: axis, data: [], symbol: 'none',
    color: PLOT_COLORS.mutedText,
    markArea: {
      silent: true, animation: false,
      label: { show: axis === 0, position: 'insideBottom', color: PLOT_COLORS.mutedText, fontSize: exportMode ? 8 : 10, fontFamily: PLOT_SANS },
      data: data as MarkAreaComponentOption['data'],
    },
  } as SeriesOption;
}

function peakMarks(peaks: readonly Peak[] | undefined, scale: 'linear' | 'db', count: number) {
  if (!peaks || peaks.length === 0) return undefined;
  const top = [...peaks].sort((a, b) => b.snrDb - a.snrDb).slice(0, count);
  return {
    symbol: 'circle', symbolSize: 6, silent: true, animation: false,
    itemStyle: { color: PLOT_COLORS.text },
    label: { show: true, position: 'top' as const, color: PLOT_COLORS.text, fontFamily: PLOT_MONO, fontSize: 11, formatter: (p: { data?: { value?: number } }) => (p.data?.value ?? 0).toFixed(2) },
    data: top.map((p) => ({ coord: [p.order, scale === 'db' ? 20 * Math.log10(Math.max(p.amplitude, 1e-12)) : p.amplitude], value: p.order })),
  };
}

/** Text for the hover: the order, the values, and the nearest candidate with its distance in %. */
export function ordersHoverText(order: number, ordersLines: readonly PartLine[], envelopeLines: readonly PartLine[], pad: number): string {
  const near = nearestCandidate(order, [...ordersLines, ...envelopeLines], pad);
  const head = `order ${order.toFixed(3)}`;
  if (!near) return head;
  const sign = near.distancePct >= 0 ? '+' : '−';
  return `${head}\nnearest: ${near.component} ${near.line.label} (${near.line.nominalOrder.toFixed(3)}), ${sign}${Math.abs(near.distancePct).toFixed(1)} %${near.inWindow ? ', inside its window' : ''}`;
}

/** The echarts option of the Orders view (two grids on one order axis). */
export function ordersOption(input: OrdersPlotInput): EChartsOption {
  const exportMode = input.forExport === true;
  const hasEnvelope = !!input.envelope && input.envelope.amplitude.length > 1;
  const maxOrder = Math.ceil(Math.max(lastOrder(input.orders), input.envelope ? lastOrder(input.envelope) : 0));
  const viewMax = input.viewMaxOrder ?? defaultViewMaxOrder(input);
  const ordersLines = linesOf(input.candidates, 'orders');
  const envelopeLines = linesOf(input.candidates, 'envelope');
  const yName = input.scale === 'db' ? `dB re 1 ${input.unit}` : input.unit;
  const axisText = { color: PLOT_COLORS.text, fontFamily: PLOT_MONO, fontSize: exportMode ? 9 : 12 };
  const nameText = { color: PLOT_COLORS.mutedText, fontFamily: PLOT_SANS, fontSize: exportMode ? 9 : 12 };
  const splitLine = { lineStyle: { color: PLOT_COLORS.grid } };
  const grids = hasEnvelope
    ? [{ left: 64, right: 24, top: exportMode ? 62 : 64, height: '32%' }, { left: 64, right: 24, top: '58%', bottom: exportMode ? 34 : 72 }]
    : [{ left: 64, right: 24, top: exportMode ? 62 : 64, bottom: exportMode ? 34 : 72 }];
  const axes = grids.map((_, i) => i);
  const xAxis = axes.map((i) => ({
    type: 'value' as const, gridIndex: i, min: 0, max: exportMode ? viewMax : maxOrder,
    name: i === axes.length - 1 ? 'order (× crank speed)' : '', nameLocation: 'middle' as const, nameGap: 26, nameTextStyle: nameText,
    axisLabel: { ...axisText, show: i === axes.length - 1 || exportMode, formatter: (v: number) => String(Number(v.toFixed(2))) }, splitLine, axisLine: { lineStyle: { color: PLOT_COLORS.grid } },
  }));
  const yAxis = axes.map((i) => ({
    type: 'value' as const, gridIndex: i, scale: input.scale === 'db',
    name: i === 0 ? `Order spectrum · ${yName}` : `Envelope spectrum${input.envelope?.bandHz ? ` (${Math.round(input.envelope.bandHz[0])}–${Math.round(input.envelope.bandHz[1])} Hz)` : ''} · ${yName}`,
    nameTextStyle: { ...nameText, align: 'left' as const }, axisLabel: { ...axisText, formatter: (v: number) => (input.scale === 'db' ? v.toFixed(0) : Number(v.toPrecision(3)).toString()) },
    splitLine,
  }));
  const series: SeriesOption[] = [
    {
      type: 'line', name: 'Order spectrum', xAxisIndex: 0, yAxisIndex: 0, showSymbol: false, symbol: 'none', sampling: 'lttb',
      lineStyle: { width: 1.2, color: PLOT_COLORS.pickup }, color: PLOT_COLORS.pickup,
      data: spectrumPoints(input.orders, input.scale, exportMode ? viewMax : Infinity),
      markPoint: exportMode ? undefined : peakMarks(input.orders.peaks, input.scale, 3),
    } as SeriesOption,
    engineSeries(exportMode ? viewMax : maxOrder, input.cylinders, input.orders.resolution, 0, exportMode),
  ];
  if (hasEnvelope && input.envelope) {
    series.push({
      type: 'line', name: 'Envelope spectrum', xAxisIndex: 1, yAxisIndex: 1, showSymbol: false, symbol: 'none', sampling: 'lttb',
      lineStyle: { width: 1.2, color: PLOT_COLORS.reference }, color: PLOT_COLORS.reference,
      data: spectrumPoints(input.envelope, input.scale, exportMode ? viewMax : Infinity),
      markPoint: exportMode ? undefined : peakMarks(input.envelope.peaks, input.scale, 3),
    } as SeriesOption);
    series.push(engineSeries(exportMode ? viewMax : maxOrder, input.cylinders, input.envelope.resolution, 1, exportMode));
  }
  input.candidates.forEach((c, index) => {
    // The report's plot shows only the confirmed part's markers, to stay readable on paper.
    if (exportMode && input.focus && c.component !== input.focus) return;
    const own = (lines: readonly PartLine[]) => lines.filter((l) => l.component === c.component);
    series.push(partSeries(own(ordersLines), index, c.component, 0, 'orders', input.focus, input.orders.resolution, exportMode));
    if (hasEnvelope) series.push(partSeries(own(envelopeLines), index, c.component, 1, 'envelope', input.focus, input.envelope!.resolution, exportMode));
  });
  const option: EChartsOption = {
    backgroundColor: PLOT_COLORS.surface,
    animation: false,
    textStyle: { fontFamily: PLOT_SANS, color: PLOT_COLORS.text },
    grid: grids,
    xAxis,
    yAxis,
    series,
    legend: {
      type: exportMode ? 'plain' : 'scroll', top: 4, left: 64, right: 24,
      textStyle: { color: PLOT_COLORS.text, fontSize: exportMode ? 9 : 12 },
      pageTextStyle: { color: PLOT_COLORS.text }, inactiveColor: '#5c646f',
      data: ['Order spectrum', ...(hasEnvelope ? ['Envelope spectrum'] : []),
        ...input.candidates.filter((c) => !exportMode || !input.focus || c.component === input.focus).map((c) => c.component), 'Engine orders (likely engine vibration)'],
      // With a focus (the suspect being reviewed) the other parts start hidden; a click on the legend shows them.
      selected: exportMode || !input.focus ? undefined : Object.fromEntries(input.candidates.filter((c) => c.component !== input.focus).map((c) => [c.component, false])),
    },
  };
  if (!exportMode) {
    option.dataZoom = [
      { type: 'inside', xAxisIndex: axes, startValue: 0, endValue: viewMax, filterMode: 'none' },
      { type: 'slider', xAxisIndex: axes, startValue: 0, endValue: viewMax, bottom: 12, height: 22, filterMode: 'none',
        textStyle: { color: PLOT_COLORS.text, fontFamily: PLOT_MONO }, borderColor: PLOT_COLORS.grid, labelFormatter: (v: number) => v.toFixed(1) },
    ];
    option.tooltip = {
      trigger: 'axis', axisPointer: { type: 'line', link: [{ xAxisIndex: 'all' }] }, backgroundColor: '#0d1117', borderColor: PLOT_COLORS.grid,
      textStyle: { color: PLOT_COLORS.text, fontFamily: PLOT_MONO, fontSize: 13 },
      formatter: (params: unknown) => {
        const list = Array.isArray(params) ? params : [params];
        const first = list[0] as { axisValue?: number } | undefined;
        const order = Number(first?.axisValue ?? 0);
        const values = (list as { seriesName?: string; value?: [number, number] }[])
          .filter((p) => Array.isArray(p.value))
          .map((p) => `${p.seriesName}: ${p.value![1].toPrecision(4)} ${yName}`);
        return [ordersHoverText(order, ordersLines, envelopeLines, input.orders.resolution), ...values].join('<br/>').replace(/\n/g, '<br/>');
      },
    };
  }
  return option;
}

/** CSV rows of the Orders view: order and amplitude of each spectrum (one row per point; the envelope's own orders). */
export function ordersCsvRows(input: Pick<OrdersPlotInput, 'orders' | 'envelope'>): { headers: string[]; rows: (number | null)[][] } {
  const o = input.orders;
  const e = input.envelope ?? null;
  const n = Math.max(o.order.length, e?.order.length ?? 0);
  const rows: (number | null)[][] = [];
  for (let i = 0; i < n; i += 1) {
    rows.push([
      i < o.order.length ? o.order[i]! : null, i < o.amplitude.length ? o.amplitude[i]! : null,
      e && i < e.order.length ? e.order[i]! : null, e && i < e.amplitude.length ? e.amplitude[i]! : null,
    ]);
  }
  return { headers: ['order', 'order_spectrum_amplitude', 'envelope_order', 'envelope_amplitude'], rows };
}
