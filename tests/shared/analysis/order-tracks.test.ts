import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { orderMapFromSpectrum, orderTracks } from '../../../shared/analysis/order-tracks';
import { runPipeline } from '../../../shared/analysis/pipeline';
import { resolveSettings } from '../../../shared/analysis/resolve-settings';
import { generateCapture } from '../../../shared/synth/generate-capture';

// Issue 20 item 5: order tracks over a speed sweep, checked on generated sweeps with a planted
// resonance. The resonance is a structural mode at a fixed frequency f_r (a bracket): the pickup
// is passed through x + G·bandpass(x), a second-order band-pass of the RBJ Audio EQ Cookbook
// (R. Bristow-Johnson, published), so a line of order o is lifted where o·rpm/60 = f_r, i.e. at
// rpm = 60·f_r / o. Each order passes the same mode at its own speed.
const drive = JSON.parse(readFileSync(new URL('../../fixtures/drives/fixture-i4-petrol.json', import.meta.url), 'utf8'));

function withResonance(x: Float32Array, fs: number, fr: number, q: number, gain: number): Float32Array {
  const w0 = (2 * Math.PI * fr) / fs;
  const alpha = Math.sin(w0) / (2 * q);
  const a0 = 1 + alpha, a1 = -2 * Math.cos(w0), a2 = 1 - alpha;
  const b0 = alpha, b2 = -alpha;
  const y = new Float32Array(x.length);
  let x1 = 0, x2 = 0, y1 = 0, y2 = 0;
  for (let i = 0; i < x.length; i++) {
    const bp = (b0 * x[i] + b2 * x2 - a1 * y1 - a2 * y2) / a0;
    x2 = x1; x1 = x[i]; y2 = y1; y1 = bp;
    y[i] = x[i] + gain * bp;
  }
  return y;
}

const SETTINGS = resolveSettings({ cylinders: 4, firingOrder: [1, 3, 4, 2] });
const RES_RPM = 1900;

function sweep(resonance: boolean) {
  const g = generateCapture({ drive, seed: 41, durationS: 20, sampleRateHz: 24_000, rpm: 800, rpmEnd: 3000, wanderPct: 0.5, engineLevel: 0.3, snrDb: 10, fault: { component: 'Alternator', fault: 'shaft' } });
  const order = g.truth.fault!.plantedOrder;
  const fr = (order * RES_RPM) / 60;
  const channels = resonance ? [g.channels[0], withResonance(g.channels[1], g.sampleRateHz, fr, 8, 9)] : g.channels;
  return { r: runPipeline({ channels, sampleRateHz: g.sampleRateHz }, SETTINGS), order, fr };
}

describe('order tracks over a speed sweep', { timeout: 60_000 }, () => {
  const planted = sweep(true);

  it('the pipeline keeps an order map for a sweep, with rows spanning the run-up', () => {
    const m = planted.r.orderMap!;
    expect(m).toBeDefined();
    expect(m.rows).toBeGreaterThan(20);
    expect(Math.min(...m.rpm)).toBeLessThan(950);
    expect(Math.max(...m.rpm)).toBeGreaterThan(2800);
  });

  it('names the speed range where the alternator line peaks: at the planted resonance rpm', () => {
    const [alt, firing] = orderTracks([planted.r.orderMap!], [{ label: 'Alternator shaft 1x', order: planted.order }, { label: 'firing order', order: 2 }]);
    expect(alt.peak).not.toBeNull();
    const bin = alt.rpm[1] - alt.rpm[0];
    expect(Math.abs(alt.peak!.rpm - RES_RPM)).toBeLessThanOrEqual(Math.max(bin, 0.03 * RES_RPM));
    expect(alt.peak!.rangeRpm[0]).toBeLessThanOrEqual(RES_RPM);
    expect(alt.peak!.rangeRpm[1]).toBeGreaterThanOrEqual(RES_RPM);
    // The firing line crosses the same mode at 60·f_r/2.
    const firingRpm = (60 * planted.fr) / 2;
    expect(firing.peak).not.toBeNull();
    expect(Math.abs(firing.peak!.rpm - firingRpm)).toBeLessThanOrEqual(Math.max(bin, 0.03 * firingRpm));
  });

  it('calls the track flat when no resonance was planted', () => {
    const plain = sweep(false);
    const [alt] = orderTracks([plain.r.orderMap!], [{ label: 'Alternator shaft 1x', order: plain.order }]);
    expect(alt.peak).toBeNull();
  });

  it('a held-rpm series of captures: the capture nearest the resonance holds the peak', () => {
    const held = [1300, 1600, 1900, 2200, 2500];
    let order = 0;
    const maps = held.map((rpm, i) => {
      const g = generateCapture({ drive, seed: 50 + i, durationS: 4, sampleRateHz: 24_000, rpm, wanderPct: 0.5, engineLevel: 0.3, snrDb: 10, fault: { component: 'Alternator', fault: 'shaft' } });
      order = g.truth.fault!.plantedOrder;
      const fr = (order * RES_RPM) / 60;
      const r = runPipeline({ channels: [g.channels[0], withResonance(g.channels[1], g.sampleRateHz, fr, 8, 9)], sampleRateHz: g.sampleRateHz }, SETTINGS);
      expect(r.orderMap).toBeUndefined();
      return orderMapFromSpectrum(r.orders.spectrum, r.speed.meanRpm);
    });
    const [alt] = orderTracks(maps, [{ label: 'Alternator shaft 1x', order }], { binRpm: 100 });
    expect(alt.rpm.length).toBe(5);
    expect(alt.peak).not.toBeNull();
    expect(Math.abs(alt.peak!.rpm - 1900)).toBeLessThanOrEqual(100);
  });

  it('refuses maps without a positive rpm', () => {
    expect(() => orderTracks([{ resolution: 0.125, bins: 10, rows: 1, rpm: Float32Array.of(0), amplitude: new Float32Array(10) }], [])).toThrow(/positive rpm/);
  });
});
