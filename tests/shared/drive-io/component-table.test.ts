import { describe, expect, it } from 'vitest';
import type { DriveDocument } from '../../../shared/drive/types';
import { COMPONENT_CSV_HEADERS, componentsToCsv, parseComponentCsv } from '../../../shared/drive-io/component-table';
import { DEMO_ENGINES } from '../../../server/db/seeders/demo-engines';

// The example document of issue 10, plus the awkward cases: factors, false flags, quoted names.
const EXAMPLE: DriveDocument = {
  name: 'Example I4', cylinders: 4, firingOrder: [1, 3, 4, 2], idleRpm: 760,
  belts: [{ name: 'Main', lengthMm: 1480, driver: 'Crankshaft', driverPulleyMm: 148 }],
  components: [
    { name: 'Crankshaft', kind: 'crankshaft' },
    { name: 'Alternator', kind: 'alternator', belt: 'Main', pulleyMm: 56,
      bearing: { balls: 8, ballMm: 6.747, pitchMm: 28.5, contactDeg: 0, rotatingRing: 'inner' } },
    { name: 'Upper idler', kind: 'idler', belt: 'Main', pulleyMm: 70, backside: true,
      bearing: { designation: '6203', rotatingRing: 'outer' } },
    { name: 'Tensioner', kind: 'tensioner', belt: 'Main', pulleyMm: 65.25, backside: false, overrunning: false,
      bearing: { factors: { ftf: 0.62, bpfo: 3.05, bpfi: 4.95, bsf: 1.99 }, rotatingRing: 'outer' } },
    { name: 'Pump, "left" side', kind: 'other', belt: 'Main', pulleyMm: 0.1 + 0.2 },
    { name: 'Vacuum pump', kind: 'vacuum_pump', fixedRatio: 0.5 },
  ],
};

const HEADER = COMPONENT_CSV_HEADERS.join(',');

describe('component table CSV', () => {
  it('writes the JSON keys as the header row', () => {
    const csv = componentsToCsv(EXAMPLE.components);
    expect(csv.split('\r\n')[0]).toBe('name,kind,belt,pulleyMm,backside,fixedRatio,overrunning,designation,balls,ballMm,pitchMm,contactDeg,ftf,bpfo,bpfi,bsf,rotatingRing,outsideMm,source');
  });

  it.each([EXAMPLE, ...DEMO_ENGINES].map((d) => [d.name, d] as const))('round-trips every component of %s', (_name, doc) => {
    const back = parseComponentCsv(componentsToCsv(doc.components), doc.belts);
    expect(back.ok).toBe(true);
    // Numbers come back as entered: 0.1 + 0.2 (0.30000000000000004 in binary) is written as 0.3.
    const entered = doc.components.map((c) => (c.pulleyMm === 0.1 + 0.2 ? { ...c, pulleyMm: 0.3 } : c));
    if (back.ok) expect(back.components).toStrictEqual(entered);
  });

  it('quotes a name holding a comma and a quote', () => {
    const csv = componentsToCsv(EXAMPLE.components);
    expect(csv).toContain('"Pump, ""left"" side"');
  });

  it('matches belt names case-insensitively and keeps the belt spelling', () => {
    const csv = `${HEADER}\nCrankshaft,crankshaft,,,,,,,,,,,,,,,\nAlt,alternator,MAIN,56,,,,,,,,,,,,,\n`;
    const r = parseComponentCsv(csv, [{ name: 'Main' }]);
    expect(r.ok && r.components[1].belt).toBe('Main');
  });

  it('accepts the columns in any order and a byte-order mark', () => {
    const cols = [...COMPONENT_CSV_HEADERS].reverse();
    const row = cols.map((c) => (c === 'name' ? 'Crankshaft' : c === 'kind' ? 'crankshaft' : ''));
    const r = parseComponentCsv(`\uFEFF${cols.join(',')}\r\n${row.join(',')}\r\n`, []);
    expect(r).toEqual({ ok: true, components: [{ name: 'Crankshaft', kind: 'crankshaft' }], lines: [2] });
  });

  it('reports every bad row and field with its line number and returns no components', () => {
    const csv = [
      HEADER,
      'Crankshaft,crankshaft,,,,,,,,,,,,,,,',
      'Alternator,alternatr,Main,5 6,,,,,,,,,,,,,',
      '',
      'Idler,idler,Serpentine,70,maybe,,,,,,,,,,,,sideways',
      'Tensioner,tensioner,Main,65,,,,,,,,,0.6,3.05,,,outer',
      'Short,other,Main',
      'Pump,water_pump,Main,"1,5",,,,,,,,,,,,,',
      'Ok,other,Main,80,,,,,,,,,,,,,',
    ].join('\n');
    const r = parseComponentCsv(csv, [{ name: 'Main' }]);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const at = (line: number) => r.problems.filter((p) => p.line === line).map((p) => p.field ?? '');
    expect(at(3).sort()).toEqual(['kind', 'pulleyMm']);
    expect(at(5).sort()).toEqual(['backside', 'belt', 'rotatingRing']);
    expect(at(6)).toEqual(['bpfi']);
    expect(r.problems.find((p) => p.line === 7)?.message).toMatch(/3 fields, the header has 19/);
    expect(r.problems.find((p) => p.line === 8)?.message).toMatch(/decimal point/);
    expect(at(2)).toEqual([]);
    expect(at(9)).toEqual([]);
    expect(r.problems.find((p) => p.field === 'belt')?.message).toMatch(/There is no belt "Serpentine" on this engine.*Main/);
  });

  it('counts lines inside a quoted field that spans lines', () => {
    const csv = `${HEADER}\n"Crank\nshaft",crankshaft,,,,,,,,,,,,,,,\nX,bogus,,,,,,,,,,,,,,,\n`;
    const r = parseComponentCsv(csv, []);
    expect(!r.ok && r.problems.map((p) => p.line)).toEqual([4]);
  });

  it('names unknown and missing columns on line 1', () => {
    const r = parseComponentCsv('name,kind,colour\nCrankshaft,crankshaft,red\n', []);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.problems.every((p) => p.line === 1)).toBe(true);
    expect(r.problems.map((p) => p.message).join(' ')).toMatch(/does not know the column "colour".*column\(s\) belt, pulleyMm.* missing/);
  });

  it('reports an unclosed quote and an empty file', () => {
    const r = parseComponentCsv(`${HEADER}\n"Crankshaft,crankshaft,,,,,,,,,,,,,,,\n`, []);
    expect(!r.ok && r.problems.map((p) => p.message).join(' ')).toMatch(/not closed/);
    const empty = parseComponentCsv('\n\n', []);
    expect(!empty.ok && empty.problems[0].message).toMatch(/empty/);
  });
});
