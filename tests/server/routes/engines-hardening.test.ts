// Issue 17 items 7–10: the engine API under size, concurrency, hostile names and impossible
// drives, each reproduced from outside through the HTTP API.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DriveDocument } from '../../../shared/drive/types';
import { COMPONENT_CSV_HEADERS } from '../../../shared/drive-io/component-table';
import { BearingType, DriveComponent, Engine, EngineRevision } from '../../../server/models';
import { DEMO_I4 } from '../../../server/db/seeders/demo-engines';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createTestShop, uniq, type TestShop } from '../../helpers/factories';

let t: TestApp;
let shop: TestShop;
let lead: ApiAgent;
let admin: ApiAgent;
let tech: ApiAgent;

const named = (doc: DriveDocument, name = `${doc.name} ${uniq()}`): DriveDocument => ({ ...doc, name });

beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
  lead = await t.signIn(shop.users.lead.email, shop.users.lead.password);
  admin = await t.signIn(shop.users.admin.email, shop.users.admin.password);
  tech = await t.signIn(shop.users.tech.email, shop.users.tech.password);
});
afterAll(async () => t.close());

async function create(doc: DriveDocument) {
  const res = await lead.post('/api/engines', doc);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.engine as DriveDocument & { id: number; version: number };
}

const csvRow = (cells: Record<string, string>) => COMPONENT_CSV_HEADERS.map((h) => cells[h] ?? '').join(',');

describe('engine API: size (item 7)', () => {
  it('requires authentication', async () => {
    const res = await (await t.agent()).get('/api/engines/1/history');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('refuses 3 000 parts through JSON and 29 000 through a CSV of nearly 1 MB with a field error, storing nothing', async () => {
    const before = await DriveComponent.count();
    const many = Array.from({ length: 3000 }, (_, i) => ({ name: `Idler ${i}`, kind: 'idler' as const, belt: 'Main', pulleyMm: 70 }));
    const res = await lead.post('/api/engines', { ...named(DEMO_I4), components: [DEMO_I4.components[0], ...many] });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([{ path: 'components', message: 'An engine can have at most 64 parts' }]);

    const created = await create(named(DEMO_I4));
    const rows = [COMPONENT_CSV_HEADERS.join(','), csvRow({ name: 'Crankshaft', kind: 'crankshaft' })];
    for (let i = 0; i < 28999; i += 1) rows.push(csvRow({ name: `P${i}`, kind: 'idler', belt: 'Main', pulleyMm: '70' }));
    const csv = rows.join('\n');
    expect(csv.length).toBeLessThan(1024 * 1024);
    const imported = await lead.send('post', `/api/engines/${created.id}/import.csv`).set('content-type', 'text/csv').send(csv);
    expect(imported.status).toBe(400);
    expect(imported.body.error.code).toBe('validation_failed');
    expect(imported.body.error.message).toMatch(/at most 64 parts/);
    expect(await DriveComponent.count()).toBe(before + DEMO_I4.components.length);
    expect((await tech.get('/api/health')).status).toBe(200);
  });

  it('answers an engine of the largest allowed size with a response that grows linearly with its parts', async () => {
    const sizes: number[] = [];
    for (const n of [16, 63]) {
      const parts = Array.from({ length: n }, (_, i) => ({ name: `Idler ${i}`, kind: 'idler' as const, belt: 'Main', pulleyMm: 60 + (i % 40) }));
      const created = await create({ ...named(DEMO_I4), components: [DEMO_I4.components[0], ...parts] });
      const res = await tech.get(`/api/engines/${created.id}`);
      expect(res.status).toBe(200);
      sizes.push(res.text.length / n);
    }
    // Bytes per part stay about the same from 16 to 63 parts (quadratic growth would give ×4).
    expect(sizes[1] / sizes[0]).toBeLessThan(1.3);
    expect(sizes[1] * 63).toBeLessThan(2 * 1024 * 1024);
  });
});

describe('engine API: torn reads and lost updates (item 8)', () => {
  it('of 20 parallel writes of one version, one is saved and 19 get 409 stale_write; none is a 500', async () => {
    const created = await create(named(DEMO_I4));
    const writes = Array.from({ length: 20 }, (_, i) =>
      lead.send('put', `/api/engines/${created.id}`, { ...created, id: undefined, name: `${created.name} w${i}`, version: created.version }));
    const results = await Promise.all(writes);
    const statuses = results.map((r) => r.status).sort();
    expect(statuses.filter((s) => s === 200)).toHaveLength(1);
    expect(statuses.filter((s) => s === 409)).toHaveLength(19);
    for (const r of results.filter((x) => x.status === 409)) expect(r.body.error.code).toBe('stale_write');
    const after = await tech.get(`/api/engines/${created.id}`);
    expect(after.body.engine.version).toBe(2);
  });

  it('never shows a torn drive to readers while writes run (every export parses, no empty driver)', async () => {
    const created = await create(named(DEMO_I4));
    let version = created.version;
    const writer = (async () => {
      for (let i = 0; i < 8; i += 1) {
        const res = await lead.send('put', `/api/engines/${created.id}`, { ...DEMO_I4, name: created.name, version });
        expect(res.status, JSON.stringify(res.body)).toBe(200);
        version = res.body.engine.version;
      }
    })();
    const readers = Array.from({ length: 16 }, () => tech.get(`/api/engines/${created.id}/export.json`));
    const [reads] = await Promise.all([Promise.all(readers), writer]);
    for (const r of reads) {
      expect(r.status).toBe(200);
      const doc = JSON.parse(r.text) as DriveDocument;
      expect(doc.belts.every((b) => b.driver === 'Crankshaft')).toBe(true);
      expect(doc.components).toHaveLength(DEMO_I4.components.length);
    }
  });

  it('an import and a rename racing: the second to arrive gets 409 stale_write, nothing is lost silently', async () => {
    const created = await create(named(DEMO_I4));
    const csv = (await tech.get(`/api/engines/${created.id}/components.csv`)).text.replace(/,Main,(\d+),/, ',Main,$1.5,');
    const [imported, renamed] = await Promise.all([
      lead.send('post', `/api/engines/${created.id}/import.csv?version=${created.version}`).set('content-type', 'text/csv').send(csv),
      lead.send('put', `/api/engines/${created.id}`, { ...created, name: `${created.name} renamed`, version: created.version }),
    ]);
    expect([imported.status, renamed.status].sort()).toEqual([200, 409]);
    const after = (await tech.get(`/api/engines/${created.id}`)).body.engine;
    if (renamed.status === 200) expect(after.name).toBe(`${created.name} renamed`);
    else expect(after.components).toStrictEqual(imported.body.engine.components);
  });

  it('a bearing deleted while an engine naming it is created: either the delete is refused or the engine is; never an engine whose export fails', async () => {
    for (let round = 0; round < 4; round += 1) {
      const designation = `Q${uniq()}`.toUpperCase();
      const row = await admin.post('/api/bearings', { designation, balls: 8, ballMm: 6, pitchMm: 30, contactDeg: 0, source: 'measured' });
      expect(row.status, JSON.stringify(row.body)).toBe(201);
      const doc = named(DEMO_I4);
      doc.components = doc.components.map((c) => (c.name === 'Tensioner' ? { ...c, bearing: { designation, rotatingRing: 'outer' as const } } : c));
      const [engine, removed] = await Promise.all([lead.post('/api/engines', doc), admin.delete(`/api/bearings/${row.body.bearing.id}`)]);
      if (engine.status === 201) {
        expect(removed.status).toBe(409);
        expect(removed.body.error.code).toBe('bearing_in_use');
        const exported = await tech.get(`/api/engines/${engine.body.engine.id}/export.json`);
        expect(exported.status).toBe(200);
      } else {
        expect(engine.status).toBe(400);
        expect(removed.status).toBe(204);
        expect(await BearingType.count({ where: { id: row.body.bearing.id } })).toBe(0);
      }
    }
  });

  it('records each save with who changed what, before and after', async () => {
    const created = await create(named(DEMO_I4));
    const alt = DEMO_I4.components.find((c) => c.kind === 'alternator')!;
    const next = { ...created, version: 1, components: created.components.map((c) => (c.name === alt.name ? { ...c, pulleyMm: 58 } : c)) };
    expect((await lead.send('put', `/api/engines/${created.id}`, next)).status).toBe(200);
    const res = await tech.get(`/api/engines/${created.id}/history`);
    expect(res.status).toBe(200);
    expect(res.body.items.map((r: { version: number; action: string }) => `${r.version}:${r.action}`)).toEqual(['2:update', '1:create']);
    expect(res.body.items[0].userName).toBe(shop.users.lead.user.name);
    expect(res.body.items[0].changes).toEqual([{ target: 'part', name: alt.name, change: 'changed', fields: [{ field: 'pulleyMm', before: String(alt.pulleyMm), after: '58' }] }]);
    expect(await EngineRevision.count({ where: { engineId: created.id } })).toBe(2);
  });

  it('answers 400 when a write does not say which version it edited', async () => {
    const created = await create(named(DEMO_I4));
    const res = await lead.send('put', `/api/engines/${created.id}`, { ...DEMO_I4, name: created.name });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([{ path: 'version', message: expect.any(String) }]);
  });
});

describe('engine API: names (item 9)', () => {
  it('refuses control characters and direction overrides as field errors; stores NFC', async () => {
    for (const name of ['Bad\u0000name', 'Bell\u0007', 'Esc\u001b[2J', 'Two\r\nlines', 'evil\u202Etxt.exe']) {
      const res = await lead.post('/api/engines', { ...DEMO_I4, name });
      expect(res.status, JSON.stringify(name)).toBe(400);
      expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain('name');
    }
    const lone = await lead.send('post', '/api/engines').set('content-type', 'application/json')
      .send(`{"name":"Lone \\ud800 x","cylinders":4,"firingOrder":[1,3,4,2],"belts":[],"components":[{"name":"Crankshaft","kind":"crankshaft"}]}`);
    expect(lone.status).toBe(400);
    const nfc = await create({ ...DEMO_I4, name: `Cafe\u0301 ${uniq()}` });
    expect(nfc.name.startsWith('Caf\u00e9 ')).toBe(true);
  });

  it('checks lengths on the stored form: ß × 40 as a designation (SS × 40 stored) is a 400, not a 500', async () => {
    const res = await admin.post('/api/bearings', { designation: 'ß'.repeat(40), balls: 8, ballMm: 6, pitchMm: 30, contactDeg: 0, source: 'measured' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    const engine = await lead.post('/api/engines', { ...DEMO_I4, name: '\u0130'.repeat(60) });
    expect(engine.status).toBe(400);
  });

  it('refuses names that differ only by accents as field errors naming the row or the CSV line, never a 409 naming an index', async () => {
    const doc = named(DEMO_I4);
    const res = await lead.post('/api/engines', { ...doc, components: [...doc.components, { name: 'TENSIÓNER', kind: 'idler', belt: 'Main', pulleyMm: 70 }] });
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(`components[${doc.components.length}].name`);
    const created = await create(doc);
    const clash = await lead.post('/api/engines', { ...doc, name: doc.name.replace('Demo', 'Démo') });
    expect(clash.status).toBe(409);
    expect(clash.body.error.code).toBe('engine_name_taken');
    expect(clash.body.error.details).toEqual([{ path: 'name', message: expect.stringMatching(/ignoring case and accents/) }]);
    const csv = [COMPONENT_CSV_HEADERS.join(','), csvRow({ name: 'Crankshaft', kind: 'crankshaft' }), csvRow({ name: 'Idler', kind: 'idler', belt: 'Main', pulleyMm: '70' }),
      csvRow({ name: 'ídler', kind: 'idler', belt: 'Main', pulleyMm: '72' })].join('\n');
    const imported = await lead.send('post', `/api/engines/${created.id}/import.csv`).set('content-type', 'text/csv').send(csv);
    expect(imported.status).toBe(400);
    expect(imported.body.error.details).toEqual([expect.objectContaining({ line: 4, field: 'name' })]);
  });

  it('escapes cells starting with =, +, -, @ in the CSV export', async () => {
    const created = await create({ ...named(DEMO_I4), components: [...DEMO_I4.components, { name: '=HYPERLINK("http://x.test")', kind: 'other', belt: 'Main', pulleyMm: 80 }, { name: '@SUM(A1)', kind: 'other', belt: 'Main', pulleyMm: 81 }] });
    const csv = (await tech.get(`/api/engines/${created.id}/export.csv`)).text;
    expect(csv).toContain(`"'=HYPERLINK(""http://x.test"")"`);
    expect(csv).toContain("'@SUM(A1)");
    expect(csv).not.toMatch(/(^|,)[=@]/m);
  });

  it('duplicating one engine ten times in parallel gives (copy), (copy 2) … (copy 10)', async () => {
    const created = await create(named(DEMO_I4));
    const results = await Promise.all(Array.from({ length: 10 }, () => lead.post(`/api/engines/${created.id}/duplicate`)));
    expect(results.map((r) => r.status)).toEqual(Array(10).fill(201));
    const names = results.map((r) => r.body.engine.name as string).sort();
    const expected = [`${created.name} (copy)`, ...Array.from({ length: 9 }, (_, i) => `${created.name} (copy ${i + 2})`)].sort();
    expect(names).toEqual(expected);
    expect(await Engine.count({ where: { shopId: shop.shop.id } })).toBeGreaterThanOrEqual(11);
  });
});

describe('engine API: impossible drives and uploads (item 10)', () => {
  it('refuses a fifth belt stage and a ratio beyond 20 with a field error', async () => {
    const chain = ['A', 'B', 'C', 'D', 'E'];
    const deep = {
      name: `Deep ${uniq()}`, cylinders: 4, firingOrder: [1, 3, 4, 2],
      belts: chain.map((n, i) => ({ name: `Belt ${n}`, lengthMm: 1000, driver: i === 0 ? 'Crankshaft' : chain[i - 1], driverPulleyMm: 100 })),
      components: [{ name: 'Crankshaft', kind: 'crankshaft' }, ...chain.map((n) => ({ name: n, kind: 'other', belt: `Belt ${n}`, pulleyMm: 100 }))],
    };
    const res = await lead.post('/api/engines', deep);
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([{ path: 'components[5].belt', message: expect.stringMatching(/at most 4 stages/) }]);
    const steep = { ...deep, belts: deep.belts.slice(0, 2).map((b) => ({ ...b, driverPulleyMm: 300 })), components: deep.components.slice(0, 3).map((c, i) => (i ? { ...c, pulleyMm: 30 } : c)) };
    const res2 = await lead.post('/api/engines', steep);
    expect(res2.status).toBe(400);
    expect(res2.body.error.details).toEqual([{ path: 'components[2].pulleyMm', message: expect.stringMatching(/100 times as fast.*0\.1 to 20/) }]);
  });

  it('answers upload mistakes with 4xx: too large 413, wrong field, two files or a cut-off body 400', async () => {
    const created = await create(named(DEMO_I4));
    const url = `/api/engines/${created.id}/import.csv`;
    const big = await lead.send('post', url).attach('file', Buffer.alloc(1024 * 1024 + 10, 'a'), 'big.csv');
    expect(big.status).toBe(413);
    const wrongField = await lead.send('post', url).attach('upload', Buffer.from('name\n'), 'x.csv');
    expect(wrongField.status).toBe(400);
    expect(wrongField.body.error.message).toMatch(/field "file"/);
    const two = await lead.send('post', url).attach('file', Buffer.from('a\n'), 'a.csv').attach('file', Buffer.from('b\n'), 'b.csv');
    expect(two.status).toBe(400);
    const cut = await lead.send('post', url).set('content-type', 'multipart/form-data; boundary=XYZ')
      .send('--XYZ\r\nContent-Disposition: form-data; name="file"; filename="a.csv"\r\nContent-Type: text/csv\r\n\r\nname,kind');
    expect(cut.status).toBe(400);
    const bigText = await lead.send('post', url).set('content-type', 'text/csv').send('x'.repeat(1024 * 1024 + 10));
    expect(bigText.status).toBe(413);
  });

  it('previews a CSV import (added, changed, removed) without writing, then imports it with the version', async () => {
    const created = await create(named(DEMO_I4));
    const table = (await tech.get(`/api/engines/${created.id}/components.csv`)).text.trim().split('\r\n');
    const alt = table.findIndex((l) => l.startsWith('Alternator'));
    table[alt] = table[alt].replace(/,Main,(\d+),/, ',Main,57,');
    const dropped = table.splice(table.length - 1, 1);
    table.push(csvRow({ name: 'Extra idler', kind: 'idler', belt: 'Main', pulleyMm: '66' }));
    const csv = table.join('\r\n');
    const preview = await lead.send('post', `/api/engines/${created.id}/import.csv?preview=1`).set('content-type', 'text/csv').send(csv);
    expect(preview.status, JSON.stringify(preview.body)).toBe(200);
    expect(preview.body.preview.parts).toEqual({ added: 1, changed: 1, removed: 1 });
    expect(preview.body.preview.changes).toContainEqual({ target: 'part', name: dropped[0].split(',')[0], change: 'removed' });
    expect((await tech.get(`/api/engines/${created.id}`)).body.engine.version).toBe(1);
    const done = await lead.send('post', `/api/engines/${created.id}/import.csv?version=${preview.body.preview.version}`).set('content-type', 'text/csv').send(csv);
    expect(done.status).toBe(200);
    expect(done.body.imported.rows).toBe(table.length - 1);
    const stale = await lead.send('post', `/api/engines/${created.id}/import.csv?version=1`).set('content-type', 'text/csv').send(csv);
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale_write');
  });
});
