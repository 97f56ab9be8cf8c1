import { describe, expect, it } from 'vitest';
import { candidateLines } from '../../../shared/drive/candidate-lines';
import type { DriveDocument } from '../../../shared/drive/types';
import { fileSlug, toCsv } from '../../../shared/plots/csv';
import { ordersCsvRows, ordersHoverText, ordersOption } from '../../../shared/plots/orders-option';
import { levelColor, spectrogramPixels } from '../../../shared/plots/spectrogram-option';
import { spectrumPoints, toDb } from '../../../shared/plots/spectrum-data';
import { linesOf } from '../../../shared/plots/candidates';

const drive = {
  name: 'I4', cylinders: 4, firingOrder: [1, 3, 4, 2],
  belts: [{ name: 'Main', lengthMm: 1480, driver: 'Crankshaft', driverPulleyMm: 148 }],
  components: [
    { name: 'Crankshaft', kind: 'crankshaft' },
    { name: 'Alternator', kind: 'alternator', belt: 'Main', pulleyMm: 56 },
  ],
} as DriveDocument;

describe('CSV for "Download data"', () => {
  it('quotes cells with commas, quotes and line breaks as RFC 4180 says', () => {
    expect(toCsv(['a', 'b'], [['x,y', 'say "hi"'], [1.5, null]])).toBe('a,b\r\n"x,y","say ""hi"""\r\n1.5,\r\n');
  });

  it('makes safe file names', () => {
    expect(fileSlug('RO-4411 · Orders')).toBe('ro-4411-orders');
  });
});

describe('spectrum points', () => {
  it('skips order 0 and converts to dB re 1 unit (20·log10)', () => {
    const pts = spectrumPoints({ order: [0, 0.5, 1], amplitude: [5, 0.1, 1], resolution: 0.5 }, 'db');
    expect(pts).toEqual([[0.5, -20], [1, 0]]);
    expect(toDb(10)).toBeCloseTo(20, 12);
  });
});

describe('orders option', () => {
  const orders = { order: [0, 1, 2, 3], amplitude: [0, 1, 2, 3], resolution: 1 / 32 };
  const envelope = { order: [0, 1, 2], amplitude: [0, 0.5, 0.2], resolution: 1 / 32, bandHz: [2000, 4000] as [number, number] };

  it('draws two grids on one order axis with a zoom over both, and one legend entry per part', () => {
    const option = ordersOption({ orders, envelope, candidates: candidateLines(drive), cylinders: 4, scale: 'linear', unit: 'g' });
    expect((option.grid as unknown[]).length).toBe(2);
    const zoom = option.dataZoom as { xAxisIndex: number[] }[];
    expect(zoom[0]!.xAxisIndex).toEqual([0, 1]);
    expect((option.legend as { data: string[] }).data).toContain('Alternator');
    expect((option.legend as { data: string[] }).data).toContain('Main');
  });

  it('puts the alternator shaft marker at 148/56 with its slip window as a band', () => {
    const option = ordersOption({ orders, envelope: null, candidates: candidateLines(drive), cylinders: 4, scale: 'linear', unit: 'g' });
    const alt = (option.series as { name: string; xAxisIndex: number; markLine?: { data: { xAxis: number }[] }; markArea?: { data: { xAxis: number }[][] } }[])
      .find((s) => s.name === 'Alternator' && s.xAxisIndex === 0)!;
    expect(alt.markLine!.data[0]!.xAxis).toBeCloseTo(148 / 56, 9);
    const [lo, hi] = alt.markArea!.data[0]!;
    // Shaft window −3 % … +0.5 % (DESIGN.md "Ranking suspects"), widened by the resolution.
    expect(lo!.xAxis).toBeCloseTo((148 / 56) * 0.97 - 1 / 32, 6);
    expect(hi!.xAxis).toBeCloseTo((148 / 56) * 1.005 + 1 / 32, 6);
  });

  it('hover text names the nearest candidate and its distance', () => {
    const text = ordersHoverText(2.6, linesOf(candidateLines(drive), 'orders'), [], 1 / 32);
    expect(text).toMatch(/nearest: Alternator shaft 1x \(2\.643\), −1\.6 %/);
  });

  it('CSV has every point of both spectra', () => {
    const { headers, rows } = ordersCsvRows({ orders, envelope });
    expect(headers).toEqual(['order', 'order_spectrum_amplitude', 'envelope_order', 'envelope_amplitude']);
    expect(rows.length).toBe(4);
    expect(rows[2]).toEqual([2, 2, 2, 0.2]);
    expect(rows[3]).toEqual([3, 3, null, null]);
  });
});

describe('spectrogram pixels', () => {
  it('draws the loudest cell brightest, low frequencies on the bottom row', () => {
    // 2 frames × 3 bins; frame 1 bin 0 is the loudest.
    const px = spectrogramPixels({ frames: 2, bins: 3, binWidthHz: 10, hopS: 0.1, startS: 0, amplitude: [1e-6, 1e-6, 1e-6, 1, 1e-6, 1e-6], rpm: [800, 800] });
    const at = (x: number, y: number) => Array.from(px.slice((y * 2 + x) * 4, (y * 2 + x) * 4 + 3));
    expect(at(1, 2)).toEqual(levelColor(1));
    expect(at(0, 2)).toEqual(levelColor(0));
    expect(px[3]).toBe(255);
  });
});
