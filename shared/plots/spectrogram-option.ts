/**
 * The Spectrogram view: frequency against time as an image (frames × bins drawn once into RGBA
 * pixels, so a 1M-value spectrogram costs one bitmap instead of a million chart cells) under an
 * echarts grid whose axes match it, with the rpm trace over it on a second axis.
 */
import type { EChartsOption } from 'echarts';
import { PLOT_COLORS, PLOT_MONO, PLOT_SANS } from './palette';

/** The spectrogram as the API serves it (shared/analysis/types.ts SpectrogramResult). */
export interface SpectrogramData {
  frames: number;
  bins: number;
  binWidthHz: number;
  hopS: number;
  startS: number;
  /** frames × bins, row-major (frame after frame), single-sided peak amplitude. */
  amplitude: ArrayLike<number>;
  /** rpm at each frame. */
  rpm: ArrayLike<number>;
}

/** Colour stops from quiet to loud (dark blue → teal → amber → near white), sRGB. */
const STOPS: [number, number, number][] = [[13, 17, 40], [30, 60, 120], [20, 150, 140], [232, 161, 39], [250, 240, 210]];

/** The colour of a level in [0, 1], interpolated between the stops. */
export function levelColor(level: number): [number, number, number] {
  const x = Math.min(1, Math.max(0, level)) * (STOPS.length - 1);
  const i = Math.min(STOPS.length - 2, Math.floor(x));
  const f = x - i;
  const a = STOPS[i]!;
  const b = STOPS[i + 1]!;
  return [Math.round(a[0] + (b[0] - a[0]) * f), Math.round(a[1] + (b[1] - a[1]) * f), Math.round(a[2] + (b[2] - a[2]) * f)];
}

/**
 * RGBA pixels (width = frames, height = bins, low frequencies at the bottom row) of the
 * spectrogram in dB, scaled from `rangeDb` below the loudest cell (default 60 dB) to the loudest.
 */
export function spectrogramPixels(s: SpectrogramData, rangeDb = 60): Uint8ClampedArray {
  const { frames, bins, amplitude } = s;
  const px = new Uint8ClampedArray(frames * bins * 4);
  let top = -Infinity;
  for (let i = 0; i < frames * bins; i += 1) top = Math.max(top, amplitude[i]!);
  const topDb = 20 * Math.log10(Math.max(top, 1e-12));
  const lut: [number, number, number][] = [];
  for (let i = 0; i < 256; i += 1) lut.push(levelColor(i / 255));
  for (let f = 0; f < frames; f += 1) {
    for (let b = 0; b < bins; b += 1) {
      const db = 20 * Math.log10(Math.max(amplitude[f * bins + b]!, 1e-12));
      const level = (db - (topDb - rangeDb)) / rangeDb;
      const c = lut[Math.round(Math.min(1, Math.max(0, level)) * 255)]!;
      const o = ((bins - 1 - b) * frames + f) * 4;
      px[o] = c[0];
      px[o + 1] = c[1];
      px[o + 2] = c[2];
      px[o + 3] = 255;
    }
  }
  return px;
}

/** Grid margins in px, shared by the option and the image's placement. */
export const SPECTROGRAM_GRID = { left: 64, right: 64, top: 40, bottom: 48 } as const;

/** The echarts option of the Spectrogram view; `image` is the bitmap of `spectrogramPixels` as a data URL. */
export function spectrogramOption(s: SpectrogramData, image: string | null, size: { width: number; height: number }): EChartsOption {
  const t0 = s.startS - s.hopS / 2;
  const t1 = s.startS + (s.frames - 0.5) * s.hopS;
  const fMax = s.bins * s.binWidthHz;
  const axisText = { color: PLOT_COLORS.text, fontFamily: PLOT_MONO, fontSize: 12 };
  const nameText = { color: PLOT_COLORS.mutedText, fontFamily: PLOT_SANS, fontSize: 12 };
  const g = SPECTROGRAM_GRID;
  const rpm: [number, number][] = [];
  for (let f = 0; f < Math.min(s.frames, s.rpm.length); f += 1) rpm.push([s.startS + f * s.hopS, s.rpm[f]!]);
  let rpmMax = 0;
  for (const [, r] of rpm) if (Number.isFinite(r)) rpmMax = Math.max(rpmMax, r);
  return {
    backgroundColor: PLOT_COLORS.surface,
    animation: false,
    textStyle: { fontFamily: PLOT_SANS, color: PLOT_COLORS.text },
    legend: { top: 4, right: g.right + 40, textStyle: { color: PLOT_COLORS.text } },
    grid: { ...g },
    graphic: image
      ? [{ type: 'image', silent: true, z: -1, left: g.left, top: g.top, style: { image, width: Math.max(1, size.width - g.left - g.right), height: Math.max(1, size.height - g.top - g.bottom) } }]
      : [],
    xAxis: { type: 'value', min: t0, max: t1, name: 'time (s)', nameLocation: 'middle', nameGap: 26, nameTextStyle: nameText, axisLabel: { ...axisText, formatter: (v: number) => v.toFixed(1) }, splitLine: { show: false } },
    yAxis: [
      { type: 'value', min: 0, max: fMax, name: 'frequency (Hz)', nameTextStyle: { ...nameText, align: 'left' }, axisLabel: axisText, splitLine: { show: false } },
      { type: 'value', min: 0, max: Math.ceil((rpmMax * 1.25) / 100) * 100 || 1000, name: 'rpm', nameTextStyle: nameText, axisLabel: axisText, splitLine: { show: false } },
    ],
    tooltip: {
      trigger: 'axis', backgroundColor: '#0d1117', borderColor: PLOT_COLORS.grid, textStyle: { color: PLOT_COLORS.text, fontFamily: PLOT_MONO, fontSize: 13 },
      formatter: (params: unknown) => {
        const p = (Array.isArray(params) ? params[0] : params) as { value?: [number, number] } | undefined;
        return p?.value ? `${p.value[0].toFixed(2)} s · ${p.value[1].toFixed(0)} rpm` : '';
      },
    },
    series: [{ type: 'line', name: 'rpm', yAxisIndex: 1, showSymbol: false, symbol: 'none', data: rpm, lineStyle: { color: '#ffffff', width: 2 }, color: '#ffffff' }],
  };
}

/** CSV rows of the Spectrogram view: one row per frame (time, rpm) then one column per bin. */
export function spectrogramCsvRows(s: SpectrogramData): { headers: string[]; rows: number[][] } {
  const headers = ['time_s', 'rpm'];
  for (let b = 0; b < s.bins; b += 1) headers.push(`${(b * s.binWidthHz).toFixed(1)}_hz`);
  const rows: number[][] = [];
  for (let f = 0; f < s.frames; f += 1) {
    const row = [s.startS + f * s.hopS, s.rpm[f] ?? NaN];
    for (let b = 0; b < s.bins; b += 1) row.push(s.amplitude[f * s.bins + b]!);
    rows.push(row);
  }
  return { headers, rows };
}
