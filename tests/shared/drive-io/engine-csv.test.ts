import { describe, expect, it } from 'vitest';
import { parseCsvText, formatCsvText } from '../../../shared/drive-io/csv-text';
import { countChanges, diffEngines } from '../../../shared/drive-io/engine-diff';
import { describeCsvProblem, engineToCsv, isEngineCsv, parseEngineCsv } from '../../../shared/drive-io/engine-csv';
import { DEMO_ENGINES, DEMO_I4 } from '../../../server/db/seeders/demo-engines';

describe('whole-engine CSV', () => {
  it.each(DEMO_ENGINES.map((d) => [d.name, d] as const))('round-trips %s (engine fields, belts, parts, notes)', (_name, doc) => {
    const withNotes = { ...doc, notes: 'belt changed 2026-01, "OEM" tensioner' };
    const csv = engineToCsv(withNotes);
    expect(isEngineCsv(csv)).toBe(true);
    const back = parseEngineCsv(csv);
    expect(back.ok, JSON.stringify(!back.ok && back.problems)).toBe(true);
    if (back.ok) expect(back.document).toStrictEqual(withNotes);
  });

  it('reports every bad row of every block in one pass, each with its line and column header', () => {
    const csv = engineToCsv(DEMO_I4).split('\r\n');
    // Lines: 1 [engine], 2 header, 3 row, 4 blank, 5 [belts], 6 header, 7 Main, 8 blank, 9 [components], 10 header, 11.. parts.
    csv[2] = csv[2].replace(',4,', ',four,');
    csv[6] = csv[6].replace(/,\d+,Crankshaft,/, ',9000,Crankshaft,');
    csv[11] = csv[11].replace(/,Main,\d+(\.\d+)?,/, ',Main,abc,');
    csv[12] = csv[12].replace(/,Main,\d+(\.\d+)?,/, ',Main,500,');
    csv[13] = csv[13].replace(/,Main,/, ',Serpentine,');
    const r = parseEngineCsv(csv.join('\r\n'));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const where = r.problems.map((p) => `${p.line}:${p.field}`);
    expect(where).toEqual(expect.arrayContaining(['3:cylinders', '7:lengthMm', '12:pulleyMm', '13:pulleyMm', '14:belt']));
    const range = r.problems.find((p) => p.line === 13)!;
    expect(describeCsvProblem(range)).toBe('Line 13, column pulleyMm (Pulley diameter): Pulley diameter must be between 20 and 400 mm (got 500)');
    for (const p of r.problems) expect(p.message).not.toMatch(/components\[|belts\[/);
  });

  it('says which block is missing and refuses rows before the [engine] title', () => {
    const r = parseEngineCsv('[engine]\nname,cylinders,firingOrder,idleRpm,notes\nX,4,1-3-4-2,750,\n');
    expect(!r.ok && r.problems.map((p) => p.message).join(' ')).toMatch(/\[components\] block is missing/);
  });
});

describe('CSV formula injection', () => {
  it('writes a cell starting with =, +, -, @, tab or CR as text and reads it back unchanged; numbers stay numbers', () => {
    const cells = ['=HYPERLINK("http://x.test","go")', '+1+2', '-cmd', '@SUM(A1)', '\tTab', '\rCR', '-3.5', 'plain'];
    const csv = formatCsvText([cells]);
    const written = parseCsvText(csv.replace(/'/g, '')).records[0].fields;
    expect(written.slice(0, 4)).toEqual(cells.slice(0, 4)); // sanity of the parser without the guard
    const line = csv.split('\r\n')[0];
    expect(line).toContain("'=HYPERLINK");
    expect(line).toContain("'+1+2");
    expect(line).toContain("'-cmd");
    expect(line).toContain("'@SUM");
    expect(line).toContain(',-3.5,');
    expect(parseCsvText(csv).records[0].fields).toEqual(cells);
  });
});

describe('engine diff', () => {
  it('lists parts added, changed (before → after) and removed, matched by name', () => {
    const after = {
      ...DEMO_I4,
      name: `${DEMO_I4.name} rev`,
      components: [...DEMO_I4.components.slice(0, 2).map((c, i) => (i === 1 ? { ...c, pulleyMm: 58 } : c)), { name: 'New idler', kind: 'idler' as const, belt: 'Main', pulleyMm: 70 }],
    };
    const changes = diffEngines(DEMO_I4, after);
    expect(changes[0]).toEqual({ target: 'engine', change: 'changed', fields: [{ field: 'name', before: DEMO_I4.name, after: after.name }] });
    const changed = changes.find((c) => c.change === 'changed' && c.target === 'part');
    expect(changed).toEqual({ target: 'part', name: DEMO_I4.components[1].name, change: 'changed', fields: [{ field: 'pulleyMm', before: String(DEMO_I4.components[1].pulleyMm), after: '58' }] });
    expect(countChanges(changes, 'part')).toEqual({ added: 1, changed: 1, removed: DEMO_I4.components.length - 2 });
    expect(diffEngines(DEMO_I4, DEMO_I4)).toEqual([]);
  });
});
