import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { candidateLines } from '../../../shared/drive/candidate-lines';
import type { ComponentCandidates, DriveDocument } from '../../../shared/drive/types';

const sample = JSON.parse(readFileSync(new URL('./fixtures/demo-i4.drive.json', import.meta.url), 'utf8')) as DriveDocument;
const line = (c: ComponentCandidates, label: string) => {
  const found = c.lines.find((l) => l.label === label);
  if (!found) throw new Error(`no line ${label} on ${c.component}`);
  return found;
};
const byName = (all: ComponentCandidates[], name: string) => all.find((c) => c.component === name)!;
const relEdges = (l: { window: [number, number]; nominalOrder: number }) => [l.window[0] / l.nominalOrder - 1, l.window[1] / l.nominalOrder - 1];

describe('candidate lines of a drive', () => {
  const all = candidateLines(sample);

  it('lists every part but the crankshaft, and every belt', () => {
    expect(all.map((c) => c.component)).toEqual(['Alternator', 'Water pump', 'Upper idler', 'Tensioner', 'Main']);
    expect(byName(all, 'Main').target).toBe('belt');
  });

  it('puts shaft, defect harmonics and belt-pass lines at ratio × factor', () => {
    const alt = byName(all, 'Alternator');
    expect(alt.ratio).toBeCloseTo(140 / 50, 12);
    expect(line(alt, 'shaft 2x').nominalOrder).toBeCloseTo(5.6, 12);
    expect(line(alt, 'BPFO 3x').nominalOrder).toBeCloseTo(3 * 2.8 * 3.12, 12);
    expect(line(alt, '2xBSF 1x').nominalOrder).toBeCloseTo(2.8 * 4.0, 12);
    expect(line(alt, 'FTF 1x').spectrum).toBe('envelope');
    expect(line(alt, 'shaft 1x').spectrum).toBe('orders');
    expect(line(byName(all, 'Main'), 'belt pass 1x').nominalOrder).toBeCloseTo((Math.PI * 140) / 1450, 12);
  });

  // Windows (DESIGN.md "Ranking suspects"; docs/references.md §4–§5): shaft −3 % … +0.5 % [practice];
  // turning race up to about +2.5 % (+3.5 % for an idler's outer race); fixed race and cage lower edge wider.
  it('gives shaft, turning-race and fixed-race windows their slip allowances', () => {
    const alt = byName(all, 'Alternator');
    const [sLo, sHi] = relEdges(line(alt, 'shaft 1x'));
    expect(sLo).toBeCloseTo(-0.03, 10);
    expect(sHi).toBeCloseTo(0.005, 10);
    const [iLo, iHi] = relEdges(line(alt, 'BPFI 1x'));
    expect(iHi).toBeCloseTo(0.025, 10);
    expect(iLo).toBeLessThan(sLo);
    const [oLo, oHi] = relEdges(line(alt, 'BPFO 1x'));
    expect(oLo).toBeLessThan(iLo);
    expect(oHi).toBeLessThan(iHi);
    const idler = byName(all, 'Upper idler');
    expect(idler.rotatingRing).toBe('outer');
    expect(relEdges(line(idler, "BPFO 1x"))[1]).toBeCloseTo(0.035, 10);
  });

  it('adds the sidebands of the turning race and of the ball', () => {
    const alt = byName(all, 'Alternator');
    expect(line(alt, 'BPFI 1x +1x shaft').nominalOrder).toBeCloseTo(2.8 * 4.88 + 2.8, 12);
    expect(line(alt, '2xBSF 1x -FTF').nominalOrder).toBeCloseTo(2.8 * 4.0 - 2.8 * 0.39, 12);
    expect(alt.lines.some((l) => l.label.startsWith('BPFO') && l.sideband !== 0)).toBe(false);
    const idler = byName(all, 'Upper idler');
    expect(idler.lines.some((l) => l.label === 'BPFO 1x -1x shaft')).toBe(true);
    expect(idler.lines.some((l) => l.label.startsWith('BPFI') && l.sideband !== 0)).toBe(false);
  });

  // Smith & Randall, MSSP 64–65, 2015 (docs/references.md §1): a defect order within slip of an integer
  // multiple of its own shaft order is ambiguous; the 6203's BPFO 3.053 sits next to 3×.
  it('flags a defect line near its own shaft harmonic, as for the 6203', () => {
    const idler = byName(all, 'Upper idler');
    expect(line(idler, 'BPFO 1x').nearShaftHarmonic).toBe(true);
    const tens = byName(all, 'Tensioner');
    expect(line(tens, 'shaft 1x').nearShaftHarmonic).toBe(false);
  });

  it('flags lines whose window touches a 0.5-order multiple as engine-synchronous', () => {
    const pump = byName(all, 'Water pump');
    expect(pump.ratio).toBeCloseTo(140 / 118, 12); // 1.186: window 1.151…1.192 holds no 0.5 multiple
    expect(line(pump, 'shaft 1x').engineSynchronous).toBe(false);
    const doc: DriveDocument = { ...sample, components: [sample.components[0], { name: 'Pump', kind: 'water_pump', belt: 'Main', pulleyMm: 140 }] };
    expect(line(candidateLines(doc)[0], 'shaft 1x').engineSynchronous).toBe(true);
  });

  it('keeps fixed-ratio windows tight and overrunning ones loose', () => {
    const doc: DriveDocument = {
      ...sample,
      components: [
        sample.components[0],
        { name: 'Vacuum pump', kind: 'vacuum_pump', fixedRatio: 0.5 },
        { name: 'Alternator', kind: 'alternator', belt: 'Main', pulleyMm: 50, overrunning: true },
      ],
    };
    const [vac, alt] = candidateLines(doc);
    expect(vac.regime).toBe('fixed');
    const [vLo, vHi] = relEdges(line(vac, 'shaft 1x'));
    expect(vHi - vLo).toBeLessThan(0.01);
    expect(alt.regime).toBe('loose');
    expect(relEdges(line(alt, 'shaft 1x'))[0]).toBeLessThan(-0.05);
    expect(vac.approximate).toBe(true); // no bearing given: rule-of-thumb factors
  });

  it('narrows a part\'s windows once its slip is known', () => {
    const known = byName(candidateLines(sample, { knownSlip: { Alternator: 0.02 } }), 'Alternator');
    const free = byName(all, 'Alternator');
    const w = (c: ComponentCandidates) => line(c, 'BPFO 1x').window;
    expect(w(known)[1] - w(known)[0]).toBeLessThan(w(free)[1] - w(free)[0]);
    expect(w(known)[0]).toBeLessThan(2.8 * 3.12 * 0.98);
    expect(w(known)[1]).toBeGreaterThan(2.8 * 3.12 * 0.98);
  });

  it('compounds creep over a second belt stage', () => {
    const doc: DriveDocument = {
      ...sample,
      belts: [...sample.belts, { name: 'Aux', lengthMm: 800, driver: 'Water pump', driverPulleyMm: 90 }],
      components: [...sample.components, { name: 'Compressor', kind: 'ac_compressor', belt: 'Aux', pulleyMm: 100 }],
    };
    const comp = byName(candidateLines(doc), 'Compressor');
    expect(comp.beltStages).toBe(2);
    expect(relEdges(line(comp, 'shaft 1x'))[0]).toBeCloseTo(-0.06, 10);
  });
});
