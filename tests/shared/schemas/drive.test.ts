import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { DriveDocumentError, jsonPath, parseDriveDocument } from '../../../shared/schemas/drive';

const load = (name: string): unknown => JSON.parse(readFileSync(new URL(`../drive/fixtures/${name}`, import.meta.url), 'utf8'));

// The document of issue 10 item 5.
const issueExample = {
  name: 'Demo I4', cylinders: 4, firingOrder: [1, 3, 4, 2], idleRpm: 760,
  belts: [{ name: 'Main', lengthMm: 1480, driver: 'Crankshaft', driverPulleyMm: 148 }],
  components: [
    { name: 'Crankshaft', kind: 'crankshaft' },
    { name: 'Alternator', kind: 'alternator', belt: 'Main', pulleyMm: 56, bearing: { balls: 8, ballMm: 6.747, pitchMm: 28.5, contactDeg: 0, rotatingRing: 'inner' } },
    { name: 'Upper idler', kind: 'idler', belt: 'Main', pulleyMm: 70, backside: true, bearing: { designation: '6203', rotatingRing: 'outer' } },
    { name: 'Tensioner', kind: 'tensioner', belt: 'Main', pulleyMm: 65, bearing: { factors: { ftf: 0.62, bpfo: 3.05, bpfi: 4.95, bsf: 1.99 }, rotatingRing: 'outer' } },
    { name: 'Vacuum pump', kind: 'vacuum_pump', fixedRatio: 0.5 },
  ],
};

function issuesOf(doc: unknown): { path: string; message: string }[] {
  try {
    parseDriveDocument(doc);
  } catch (error) {
    if (error instanceof DriveDocumentError) return error.issues;
    throw error;
  }
  return [];
}

const clone = <T>(v: T): T => JSON.parse(JSON.stringify(v)) as T;

describe('parseDriveDocument', () => {
  it('parses the issue example and the shared samples (including a rig with no belts)', () => {
    expect(parseDriveDocument(issueExample).components).toHaveLength(5);
    expect(parseDriveDocument(load('demo-i4.drive.json')).belts).toHaveLength(1);
    expect(parseDriveDocument(load('test-rig.drive.json')).belts).toEqual([]);
  });

  it('reports every range violation with its JSON path, not just the first', () => {
    const doc = clone(issueExample) as any;
    doc.components[1].pulleyMm = 12;
    doc.components[1].bearing.ballMm = 50;
    doc.components[1].bearing.balls = 4;
    doc.components[2].bearing.contactDeg = 60;
    doc.belts[0].lengthMm = 4000;
    const paths = issuesOf(doc).map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining([
      'components[1].pulleyMm', 'components[1].bearing.ballMm', 'components[1].bearing.balls', 'components[2].bearing.contactDeg', 'belts[0].lengthMm',
    ]));
    expect(issuesOf(doc).find((i) => i.path === 'components[1].pulleyMm')?.message).toMatch(/20 and 400 mm.*12/);
  });

  it('requires the ball to be smaller than the pitch diameter', () => {
    const doc = clone(issueExample) as any;
    doc.components[1].bearing = { balls: 8, ballMm: 30, pitchMm: 28 };
    expect(issuesOf(doc)).toContainEqual({ path: 'components[1].bearing.ballMm', message: expect.stringMatching(/smaller than pitchMm/) });
  });

  it('requires names unique ignoring case', () => {
    const doc = clone(issueExample) as any;
    doc.components[3].name = 'upper IDLER';
    expect(issuesOf(doc).map((i) => i.path)).toContain('components[3].name');
  });

  it('requires the firing order to be a permutation of 1..cylinders', () => {
    for (const firingOrder of [[1, 3, 4], [1, 3, 3, 2], [1, 3, 5, 2], [0, 1, 2, 3]]) {
      const doc = { ...clone(issueExample), firingOrder };
      expect(issuesOf(doc).map((i) => i.path)).toContain('firingOrder');
    }
  });

  it('requires exactly one crankshaft', () => {
    const none = clone(issueExample) as any;
    none.components[0].kind = 'other';
    none.components[0].fixedRatio = 1;
    expect(issuesOf(none).map((i) => i.path)).toContain('components');
    const two = clone(issueExample) as any;
    two.components.push({ name: 'Second crank', kind: 'crankshaft' });
    expect(issuesOf(two).map((i) => i.path)).toContain('components[5].kind');
  });

  it('requires belts chained to the crank, without loops', () => {
    const doc = clone(issueExample) as any;
    doc.belts.push({ name: 'Loop', lengthMm: 800, driver: 'Fan', driverPulleyMm: 90 });
    doc.components.push({ name: 'Fan', kind: 'fan', belt: 'Loop', pulleyMm: 120 });
    doc.belts.push({ name: 'Ghost', lengthMm: 800, driver: 'Nobody', driverPulleyMm: 90 });
    const issues = issuesOf(doc);
    expect(issues.find((i) => i.path === 'belts[1].driver')?.message).toMatch(/not driven from the crankshaft/);
    expect(issues.find((i) => i.path === 'belts[2].driver')?.message).toMatch(/not among the components/);
  });

  it('requires a pulley on a belt part, a belt that exists, and no belt on fixed-ratio parts', () => {
    const doc = clone(issueExample) as any;
    delete doc.components[1].pulleyMm;
    doc.components[2].belt = 'Aux';
    doc.components[4].belt = 'Main';
    doc.components[4].pulleyMm = 80;
    doc.components.push({ name: 'Loose part', kind: 'other' });
    const paths = issuesOf(doc).map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['components[1].pulleyMm', 'components[2].belt', 'components[4].fixedRatio', 'components[5]']));
  });

  it('reports wrong types and unknown keys', () => {
    const doc = clone(issueExample) as any;
    doc.cylinders = 'four';
    doc.components[1].pulleyDiameter = 56;
    const paths = issuesOf(doc).map((i) => i.path);
    expect(paths).toContain('cylinders');
    expect(paths.some((p) => p.startsWith('components[1]'))).toBe(true);
    expect(issuesOf(42)[0].path).toBe('$');
  });

  it('formats zod paths as JSON paths', () => {
    expect(jsonPath(['components', 2, 'bearing', 'ballMm'])).toBe('components[2].bearing.ballMm');
    expect(jsonPath([])).toBe('$');
  });
});
