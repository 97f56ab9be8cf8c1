/**
 * The Engine cycle view as an echarts option: the pickup's 720° synchronous average and its
 * short-window RMS against crank angle from cylinder-1 TDC, every cylinder's firing slot labelled
 * in firing order, and the located event marked ("in cylinder 3's firing slot, 40° after its TDC").
 * When the reference cannot tell the revolutions (or cylinders) apart, every candidate slot is
 * drawn and the note says how to resolve it. The slot names whose power stroke is under way, not
 * the source of the noise (DESIGN.md pipeline step 6).
 */
import type { EChartsOption, SeriesOption } from 'echarts';
import type { CycleEvent } from '../analysis/types';
import { PLOT_COLORS, PLOT_MONO, PLOT_SANS } from './palette';

/** What the Engine cycle view draws. */
export interface CyclePlotInput {
  averageDeg: ArrayLike<number>;
  rmsDeg?: ArrayLike<number> | null;
  firingOrder: readonly number[];
  phaseResolved: boolean;
  event: CycleEvent | null;
  unit: string;
  forExport?: boolean;
}

/** One cylinder's firing slot: from its TDC (crank degrees after cylinder-1 TDC) for 720/cylinders degrees. */
export interface CycleSlot {
  cylinder: number;
  startDeg: number;
  endDeg: number;
}

/** Slots in firing order: the i-th cylinder of the firing order reaches its firing TDC at i·720/n degrees. */
export function cycleSlots(firingOrder: readonly number[]): CycleSlot[] {
  const n = firingOrder.length;
  if (n === 0) return [];
  const width = 720 / n;
  return firingOrder.map((cylinder, i) => ({ cylinder, startDeg: i * width, endDeg: (i + 1) * width }));
}

/** Where the event may be: one angle when the phase is resolved, one per candidate cylinder otherwise. */
export function eventAngles(event: CycleEvent, firingOrder: readonly number[], phaseResolved: boolean): { cylinder: number | null; angleDeg: number }[] {
  if (phaseResolved || event.candidates.length <= 1) return [{ cylinder: event.cylinder, angleDeg: event.angleDeg }];
  const slots = cycleSlots(firingOrder);
  return event.candidates.map((c) => {
    const slot = slots.find((s) => s.cylinder === c);
    return { cylinder: c, angleDeg: slot ? (slot.startDeg + event.afterTdcDeg) % 720 : event.angleDeg };
  });
}

/** The sentence under the view: where the event is, or which slots it may be in and how to tell. */
export function cycleEventText(event: CycleEvent | null, phaseResolved: boolean): string {
  if (!event) return 'No impulsive event stands out over the engine cycle.';
  const after = Math.round(event.afterTdcDeg);
  if (phaseResolved && event.cylinder !== null) return `In cylinder ${event.cylinder}'s firing slot, ${after}° after its TDC.`;
  const list = event.candidates.length > 0 ? event.candidates.join(' or ') : 'one of several cylinders';
  return `In cylinder ${list}'s firing slot, ${after}° after its TDC — the reference cannot tell which. ` +
    'Capture again with a cylinder-1 reference (the coil or injector of cylinder 1) or a cam reference to resolve it.';
}

function anglePoints(values: ArrayLike<number>): [number, number][] {
  const n = values.length;
  const out: [number, number][] = [];
  for (let i = 0; i < n; i += 1) out.push([(720 * i) / n, values[i]!]);
  return out;
}

/** The echarts option of the Engine cycle view. */
export function cycleOption(input: CyclePlotInput): EChartsOption {
  const exportMode = input.forExport === true;
  const slots = cycleSlots(input.firingOrder);
  const candidateCylinders = new Set(input.event && !input.phaseResolved ? input.event.candidates : []);
  const eventCylinder = input.event?.cylinder ?? null;
  const axisText = { color: PLOT_COLORS.text, fontFamily: PLOT_MONO, fontSize: exportMode ? 9 : 12 };
  const nameText = { color: PLOT_COLORS.mutedText, fontFamily: PLOT_SANS, fontSize: exportMode ? 9 : 12 };
  const slotAreas = slots.map((s, i) => {
    const highlighted = candidateCylinders.has(s.cylinder) || (input.phaseResolved && s.cylinder === eventCylinder);
    return [
      {
        xAxis: s.startDeg, name: `Cyl ${s.cylinder}`,
        itemStyle: { color: highlighted ? PLOT_COLORS.firingBand : i % 2 === 0 ? 'rgba(163,172,184,0.07)' : 'rgba(0,0,0,0)' },
      },
      { xAxis: s.endDeg },
    ];
  });
  const events = input.event ? eventAngles(input.event, input.firingOrder, input.phaseResolved) : [];
  const series: SeriesOption[] = [
    {
      type: 'line', name: 'Synchronous average', showSymbol: false, symbol: 'none', sampling: 'lttb', yAxisIndex: 0,
      lineStyle: { width: 1.2, color: PLOT_COLORS.pickup }, color: PLOT_COLORS.pickup, data: anglePoints(input.averageDeg),
      markArea: {
        silent: true, animation: false,
        label: { show: true, position: 'insideTop', color: PLOT_COLORS.text, fontFamily: PLOT_SANS, fontSize: exportMode ? 9 : 12, fontWeight: 'bold' },
        data: slotAreas as never,
      },
      markLine: events.length === 0 ? undefined : {
        symbol: 'none', silent: true, animation: false,
        lineStyle: { color: PLOT_COLORS.event, width: 2, type: input.phaseResolved ? 'solid' : 'dashed' },
        label: { show: true, position: 'insideEndTop', color: PLOT_COLORS.event, fontFamily: PLOT_MONO, fontSize: exportMode ? 9 : 12, formatter: (p: { name?: string }) => p.name ?? '' },
        data: events.map((e) => ({ xAxis: e.angleDeg, name: `${e.cylinder !== null ? `cyl ${e.cylinder} ` : ''}+${Math.round(input.event!.afterTdcDeg)}°` })),
      },
    } as SeriesOption,
  ];
  if (input.rmsDeg && input.rmsDeg.length > 0) {
    series.push({
      type: 'line', name: 'Short-window RMS', showSymbol: false, symbol: 'none', sampling: 'lttb', yAxisIndex: 1,
      lineStyle: { width: 1.5, color: PLOT_COLORS.warning }, color: PLOT_COLORS.warning, data: anglePoints(input.rmsDeg),
    } as SeriesOption);
  }
  const option: EChartsOption = {
    backgroundColor: PLOT_COLORS.surface,
    animation: false,
    textStyle: { fontFamily: PLOT_SANS, color: PLOT_COLORS.text },
    legend: { top: 4, left: 64, textStyle: { color: PLOT_COLORS.text, fontSize: exportMode ? 9 : 12 } },
    grid: { left: 64, right: 64, top: 48, bottom: exportMode ? 34 : 44 },
    xAxis: {
      type: 'value', min: 0, max: 720, interval: 90, name: 'crank angle from cylinder-1 TDC (°)', nameLocation: 'middle', nameGap: 26,
      nameTextStyle: nameText, axisLabel: axisText, splitLine: { lineStyle: { color: PLOT_COLORS.grid } },
    },
    yAxis: [
      { type: 'value', name: `average (${input.unit})`, nameTextStyle: { ...nameText, align: 'left' }, axisLabel: { ...axisText, formatter: (v: number) => Number(v.toPrecision(3)).toString() }, splitLine: { lineStyle: { color: PLOT_COLORS.grid } } },
      { type: 'value', name: `RMS (${input.unit})`, nameTextStyle: { ...nameText, align: 'right' }, axisLabel: { ...axisText, formatter: (v: number) => Number(v.toPrecision(3)).toString() }, splitLine: { show: false } },
    ],
    series,
  };
  if (!exportMode) {
    option.tooltip = {
      trigger: 'axis', backgroundColor: '#0d1117', borderColor: PLOT_COLORS.grid, textStyle: { color: PLOT_COLORS.text, fontFamily: PLOT_MONO, fontSize: 13 },
      formatter: (params: unknown) => {
        const list = (Array.isArray(params) ? params : [params]) as { seriesName?: string; value?: [number, number] }[];
        const angle = Number(list[0]?.value?.[0] ?? 0);
        const slot = slots.find((s) => angle >= s.startDeg && angle < s.endDeg);
        const head = `${angle.toFixed(1)}° · ${slot ? `cylinder ${slot.cylinder}'s slot, ${(angle - slot.startDeg).toFixed(0)}° after its TDC` : ''}`;
        return [head, ...list.filter((p) => p.value).map((p) => `${p.seriesName}: ${p.value![1].toPrecision(4)} ${input.unit}`)].join('<br/>');
      },
    };
    option.dataZoom = [{ type: 'inside', xAxisIndex: 0, filterMode: 'none' }];
  }
  return option;
}

/** CSV rows of the Engine cycle view: angle, average, RMS. */
export function cycleCsvRows(input: Pick<CyclePlotInput, 'averageDeg' | 'rmsDeg'>): { headers: string[]; rows: (number | null)[][] } {
  const n = input.averageDeg.length;
  const rows: (number | null)[][] = [];
  for (let i = 0; i < n; i += 1) {
    rows.push([(720 * i) / n, input.averageDeg[i]!, input.rmsDeg && i < input.rmsDeg.length ? input.rmsDeg[i]! : null]);
  }
  return { headers: ['crank_angle_deg', 'synchronous_average', 'short_window_rms'], rows };
}
