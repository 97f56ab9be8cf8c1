import { describe, expect, it } from 'vitest';
import { designationLookup, exportFileName, toAnalyzeDocument, UnknownDesignationError } from '../../../shared/drive-io/analyze-document';
import { DEMO_I4 } from '../../../server/db/seeders/demo-engines';

const TABLE = designationLookup([{ designation: '6203', balls: 8, ballMm: 6.746, pitchMm: 28.499, contactDeg: 0 },
  { designation: '6205', balls: 9, ballMm: 7.94, pitchMm: 39.04, contactDeg: 0 }]);

describe('toAnalyzeDocument', () => {
  it('writes every designated bearing\'s geometry beside its designation and keeps the turning ring', () => {
    const out = toAnalyzeDocument(DEMO_I4, TABLE);
    const idler = out.components.find((c) => c.name === 'Upper idler');
    expect(idler?.bearing).toEqual({ designation: '6203', balls: 8, ballMm: 6.746, pitchMm: 28.499, contactDeg: 0, rotatingRing: 'outer' });
    // Components without designations pass through; the input is not modified.
    expect(out.components[1]).toEqual(DEMO_I4.components[1]);
    expect(DEMO_I4.components.find((c) => c.name === 'Upper idler')?.bearing?.designation).toBe('6203');
  });

  it('keeps measured geometry given beside a designation', () => {
    const doc = { ...DEMO_I4, components: [DEMO_I4.components[0], { name: 'A', kind: 'idler' as const, belt: 'Main', pulleyMm: 70,
      bearing: { designation: '6203', balls: 9, ballMm: 6, pitchMm: 30 } }] };
    expect(toAnalyzeDocument(doc, TABLE).components[1].bearing).toEqual({ designation: '6203', balls: 9, ballMm: 6, pitchMm: 30 });
  });

  it('names the component and designation it cannot resolve', () => {
    const doc = { ...DEMO_I4, components: [{ name: 'Odd idler', kind: 'idler' as const, bearing: { designation: 'X99' } }] };
    expect(() => toAnalyzeDocument(doc, TABLE)).toThrow(UnknownDesignationError);
    expect(() => toAnalyzeDocument(doc, TABLE)).toThrow(/Odd idler.*X99/);
  });

  it('keeps the source and writes the numbers as entered, without binary noise (issue 17 item 3)', () => {
    // The CWRU 6203 ball is 0.2656 in; 0.2656 × 25.4 is 6.746239999999999 in binary floating point.
    const lookup = designationLookup([{ designation: '6203', balls: 8, ballMm: 0.2656 * 25.4, pitchMm: 1.122 * 25.4, contactDeg: 0, source: 'published' },
      { designation: '6205', balls: 9, ballMm: 0.3126 * 25.4, pitchMm: 1.537 * 25.4, contactDeg: 0, source: 'published' }]);
    const bearing = toAnalyzeDocument(DEMO_I4, lookup).components.find((c) => c.name === 'Upper idler')?.bearing;
    expect(bearing).toMatchObject({ designation: '6203', ballMm: 6.74624, pitchMm: 28.4988, source: 'published' });
    expect(JSON.stringify(bearing)).not.toMatch(/99999/);
  });

  it('matches designations as the kinematics do (case and seal suffix ignored)', () => {
    expect(TABLE('6203-2rs')?.balls).toBe(8);
    expect(TABLE('6205 ZZ')?.balls).toBe(9);
  });

  it('makes a file name from the engine name', () => {
    expect(exportFileName('Demo 1.6 I4 petrol', 'drive.json')).toBe('demo-1-6-i4-petrol.drive.json');
    expect(exportFileName('***', 'components.csv')).toBe('engine.components.csv');
  });
});
