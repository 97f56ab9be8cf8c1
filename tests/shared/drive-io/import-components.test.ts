import { describe, expect, it } from 'vitest';
import { COMPONENT_CSV_HEADERS, componentsToCsv } from '../../../shared/drive-io/component-table';
import { importComponentCsv } from '../../../shared/drive-io/import-components';
import { DEMO_V6 } from '../../../server/db/seeders/demo-engines';

const HEADER = COMPONENT_CSV_HEADERS.join(',');

describe('importComponentCsv', () => {
  it('replaces the components of a valid document and keeps its belts', () => {
    const r = importComponentCsv(DEMO_V6, componentsToCsv(DEMO_V6.components.slice(0, 3)));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.document.components).toEqual(DEMO_V6.components.slice(0, 3));
    expect(r.document.belts).toEqual(DEMO_V6.belts);
  });

  it('maps the drive schema problems to CSV lines and columns', () => {
    const csv = [
      HEADER,
      'Crankshaft,crankshaft,,,,,,,,,,,,,,,',
      'Alternator,alternator,Front,10,,,,,,,,,,,,,', // pulley below 20 mm
      'alternator,other,Front,80,,,,,,,,,,,,,', // name used twice (case-insensitive)
      'Crank 2,crankshaft,,,,,,,,,,,,,,,', // a second crankshaft
      'Pump,water_pump,Front,120,,,,,8,30,20,0,,,,,inner', // ball larger than pitch
    ].join('\n');
    const r = importComponentCsv(DEMO_V6, csv);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const lines = new Set(r.problems.map((p) => p.line));
    expect(lines).toEqual(new Set([3, 4, 5, 6]));
    expect(r.problems.find((p) => p.line === 3)?.field).toBe('pulleyMm');
    expect(r.problems.find((p) => p.line === 6)?.field).toBe('ballMm');
    expect(r.problems.find((p) => p.line === 4)?.message).toMatch(/already has the name/);
    expect(r.problems.find((p) => p.line === 5)?.message).toMatch(/crankshaft/);
  });

  it('reports a driver a CSV removed against the belt, outside the file', () => {
    const csv = `${HEADER}\nCrank,crankshaft,,,,,,,,,,,,,,,\n`;
    const r = importComponentCsv(DEMO_V6, csv);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.problems.some((p) => p.line === undefined && p.path === 'belts[0].driver')).toBe(true);
  });
});
