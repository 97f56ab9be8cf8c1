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
    expect(issuesOf(doc)).toContainEqual({ path: 'components[1].bearing.ballMm', message: expect.stringMatching(/smaller than the pitch diameter/) });
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
    expect(issues.find((i) => i.path === 'belts[2].driver')?.message).toMatch(/There is no part named "Nobody"/);
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

  it('says what is wrong in the user\'s words, never a schema name (issue 17 item 2)', () => {
    const doc = clone(issueExample) as any;
    doc.components[1].pulleyMm = 12;
    doc.belts[0].lengthMm = 4000;
    doc.idleRpm = 50;
    const issues = issuesOf(doc);
    expect(issues.find((i) => i.path === 'components[1].pulleyMm')?.message).toBe('Pulley diameter must be between 20 and 400 mm (got 12)');
    expect(issues.find((i) => i.path === 'belts[0].lengthMm')?.message).toMatch(/^Belt length must be between 500 and 3000 mm/);
    expect(issues.find((i) => i.path === 'idleRpm')?.message).toMatch(/^Idle speed must be between 300 and 3000 rpm/);
    for (const i of issues) expect(i.message).not.toMatch(/pulleyMm|lengthMm|idleRpm|components\[/);
    // The thrown summary names the part by its row and name, not by a JSON path.
    expect(() => parseDriveDocument(doc)).toThrow(/part 2 "Alternator": Pulley diameter/);
  });

  it('refuses control characters, direction overrides and lone surrogates in names, and stores NFC', () => {
    for (const bad of ['Alt\u0000ernator', 'Alt\u0007', 'A\u001b[31m', 'Line\nbreak', 'Alt\u202Erotaned', 'Alt\ud800x']) {
      const doc = clone(issueExample) as any;
      doc.components[1].name = bad;
      expect(issuesOf(doc).map((i) => i.path), JSON.stringify(bad)).toContain('components[1].name');
    }
    const doc = clone(issueExample) as any;
    doc.name = 'Cafe\u0301 engine'; // e + combining acute (NFD)
    expect(parseDriveDocument(doc).name).toBe('Caf\u00e9 engine');
  });

  it('checks the length of a name on its stored form (NFC, and the lower-cased key)', () => {
    const doc = clone(issueExample) as any;
    doc.name = '\u0130'.repeat(60); // İ lower-cases to two code points: 120 in the key
    expect(issuesOf(doc).find((i) => i.path === 'name')?.message).toMatch(/at most 100 characters/);
    doc.name = 'e\u0301'.repeat(100); // 200 code units typed, 100 characters stored
    expect(issuesOf(doc).map((i) => i.path)).not.toContain('name');
  });

  it('refuses two names that differ only by accents or case, naming the row', () => {
    const doc = clone(issueExample) as any;
    doc.components[3].name = 'ALTERNÁTOR';
    expect(issuesOf(doc)).toContainEqual({ path: 'components[3].name', message: expect.stringMatching(/row 2.*ignoring case and accents/) });
  });

  it('caps the parts and belts of an engine and skips the rules across rows then', () => {
    const doc = clone(issueExample) as any;
    doc.components = Array.from({ length: 3000 }, (_, i) => ({ name: `Idler ${i}`, kind: 'idler', belt: 'Main', pulleyMm: 70 }));
    const issues = issuesOf(doc);
    expect(issues).toEqual([{ path: 'components', message: 'An engine can have at most 64 parts' }]);
    doc.components = clone(issueExample).components;
    doc.belts = Array.from({ length: 9 }, (_, i) => ({ name: `Belt ${i}`, lengthMm: 1000, driver: 'Crankshaft', driverPulleyMm: 100 }));
    expect(issuesOf(doc).map((i) => i.message)).toContain('An engine can have at most 8 belts');
  });

  it('limits a drive to 4 belt stages and an overall ratio of 0.1 to 20', () => {
    // Five belts in a chain: crank → A → B → C → D → E.
    const names = ['A', 'B', 'C', 'D', 'E'];
    const doc = {
      name: 'Deep', cylinders: 1, firingOrder: [1],
      belts: names.map((n, i) => ({ name: `Belt ${n}`, lengthMm: 1000, driver: i === 0 ? 'Crank' : names[i - 1], driverPulleyMm: 100 })),
      components: [{ name: 'Crank', kind: 'crankshaft' }, ...names.map((n) => ({ name: n, kind: 'other', belt: `Belt ${n}`, pulleyMm: 100 }))],
    };
    const deep = issuesOf(doc);
    expect(deep).toEqual([{ path: 'components[5].belt', message: expect.stringMatching(/5 belts away.*at most 4 stages/) }]);
    // One stage of 400/20 is the limit (20); two give 400: refused at the pulley of the second part only.
    const steep = {
      ...doc, belts: doc.belts.slice(0, 2).map((b) => ({ ...b, driverPulleyMm: 400 })),
      components: [doc.components[0], { ...doc.components[1], pulleyMm: 20 }, { ...doc.components[2], pulleyMm: 20 }],
    };
    const issues = issuesOf(steep);
    expect(issues.map((i) => i.path)).toEqual(['components[2].pulleyMm']);
    expect(issues[0].message).toMatch(/400 times as fast/);
    const fixed = clone(issueExample) as any;
    fixed.components[4].fixedRatio = 25;
    expect(issuesOf(fixed).find((i) => i.path === 'components[4].fixedRatio')?.message).toMatch(/between 0.1 and 20/);
  });

  it('reads a bearing designation with its geometry and source, and a measured outside diameter', () => {
    const doc = clone(issueExample) as any;
    doc.components[1].outsideMm = 54;
    doc.components[1].bearing = { designation: '6203', balls: 8, ballMm: 6.74624, pitchMm: 28.4988, contactDeg: 0, source: 'published', rotatingRing: 'inner' };
    const parsed = parseDriveDocument(doc);
    expect(parsed.components[1]).toMatchObject({ outsideMm: 54, bearing: { designation: '6203', source: 'published', ballMm: 6.74624 } });
  });
});

