import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DriveDocument } from '../../../shared/drive/types';
import { COMPONENT_CSV_HEADERS } from '../../../shared/drive-io/component-table';
import { parseDriveDocument } from '../../../shared/schemas/drive';
import { Belt, DriveComponent, Engine } from '../../../server/models';
import { seedPublishedBearings } from '../../../server/services/bearings';
import { registerEngineUsage } from '../../../server/services/engine-usage';
import { DEMO_DIESEL_I4, DEMO_I4, DEMO_V6 } from '../../../server/db/seeders/demo-engines';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createTestShop, uniq, type TestShop } from '../../helpers/factories';

let t: TestApp;
let shop: TestShop;
let other: TestShop;
let lead: ApiAgent;
let tech: ApiAgent;
let specialist: ApiAgent;
let otherAdmin: ApiAgent;

const named = (doc: DriveDocument, name = `${doc.name} ${uniq()}`): DriveDocument => ({ ...doc, name });

beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
  other = await createTestShop();
  await seedPublishedBearings(shop.shop.id);
  lead = await t.signIn(shop.users.lead.email, shop.users.lead.password);
  tech = await t.signIn(shop.users.tech.email, shop.users.tech.password);
  specialist = await t.signIn(shop.users.specialist.email, shop.users.specialist.password);
  otherAdmin = await t.signIn(other.users.admin.email, other.users.admin.password);
});
afterAll(async () => t.close());

async function create(doc: DriveDocument & { notes?: string }) {
  const res = await lead.post('/api/engines', doc);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.engine as DriveDocument & { id: number; notes: string; computed: { components: { component: string; ratio: number; backwards: boolean; orders: { bpfo: number | null } }[]; belts: { belt: string; speedMs: number }[] } };
}

describe('engines API', () => {
  it('requires authentication', async () => {
    const res = await (await t.agent()).get('/api/engines');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('creates an engine from a drive document and reads it back unchanged, with computed ratios and orders', async () => {
    const doc = named(DEMO_V6);
    const created = await create({ ...doc, notes: 'second belt from the crank' });
    const res = await tech.get(`/api/engines/${created.id}`);
    expect(res.status).toBe(200);
    const { id, notes, updatedAt, computed, version, ...document } = res.body.engine;
    expect(id).toBe(created.id);
    expect(version).toBe(1);
    expect(notes).toBe('second belt from the crank');
    expect(typeof updatedAt).toBe('string');
    expect(document).toStrictEqual(doc);
    const alt = computed.components.find((c: { component: string }) => c.component === 'Alternator');
    expect(alt.ratio).toBeCloseTo(162 / 60, 12);
    // 6203 on the alternator: BPFO factor 3.0530 per turn, CWRU published (docs/references.md §1).
    expect(alt.orders.bpfo / (alt.ratio * 3.053)).toBeCloseTo(1, 3);
    expect(computed.belts.find((b: { belt: string }) => b.belt === 'Front').speedMs).toBeCloseTo(Math.PI * 0.162 * (680 / 60), 9);
    expect(computed.candidates.length).toBe(doc.components.length - 1 + doc.belts.length);
  });

  it('lists, searches, sorts and pages the shop only', async () => {
    const tag = uniq();
    for (const n of ['Alpha', 'Bravo', 'Charlie']) await create(named(DEMO_I4, `${tag} ${n}`));
    await otherAdmin.post('/api/engines', named(DEMO_I4, `${tag} Foreign`));
    const page1 = await specialist.get(`/api/engines?search=${tag}&sort=-name&pageSize=2&page=1`);
    expect(page1.status).toBe(200);
    expect(page1.body).toMatchObject({ total: 3, page: 1, pageSize: 2 });
    expect(page1.body.items.map((e: { name: string }) => e.name)).toEqual([`${tag} Charlie`, `${tag} Bravo`]);
    expect(page1.body.items[0]).toMatchObject({ cylinders: 4, firingOrder: [1, 3, 4, 2], belts: 1, components: DEMO_I4.components.length });
    const page2 = await specialist.get(`/api/engines?search=${tag}&sort=-name&pageSize=2&page=2`);
    expect(page2.body.items.map((e: { name: string }) => e.name)).toEqual([`${tag} Alpha`]);
    const bad = await specialist.get('/api/engines?sort=colour');
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_failed');
  });

  it('answers 400 validation_failed naming every JSON path, and writes nothing', async () => {
    const before = await Engine.count();
    const doc = named(DEMO_I4);
    const bad = {
      ...doc,
      firingOrder: [1, 2, 2, 4],
      components: doc.components.map((c, i) => (i === 1 ? { ...c, pulleyMm: 5 } : i === 2 ? { ...c, belt: 'Nowhere' } : c)),
    };
    const res = await lead.post('/api/engines', bad);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['firingOrder', 'components[1].pulleyMm', 'components[2].belt']));
    expect(await Engine.count()).toBe(before);
  });

  it('refuses a designation the shop table does not hold, at its path', async () => {
    const doc = named(DEMO_I4);
    doc.components = doc.components.map((c) => (c.name === 'Tensioner' ? { ...c, bearing: { designation: 'ZX-999', rotatingRing: 'outer' } } : c));
    const res = await lead.post('/api/engines', doc);
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain('components[6].bearing.designation');
  });

  it('refuses a second engine of the same name (case-insensitive) with 409', async () => {
    const doc = named(DEMO_I4);
    await create(doc);
    const res = await lead.post('/api/engines', { ...doc, name: doc.name.toUpperCase() });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('engine_name_taken');
  });

  it('updates the whole drive in place and keeps nothing of the old rows', async () => {
    const created = await create(named(DEMO_I4));
    const next = named(DEMO_DIESEL_I4);
    const res = await lead.send('put', `/api/engines/${created.id}`, { ...next, version: 1 });
    expect(res.status).toBe(200);
    const { id: _id, notes: _n, updatedAt: _u, computed: _c, version, ...document } = res.body.engine;
    expect(version).toBe(2);
    expect(document).toStrictEqual(next);
    expect(await DriveComponent.count({ where: { engineId: created.id } })).toBe(DEMO_DIESEL_I4.components.length);
    expect(await Belt.count({ where: { engineId: created.id } })).toBe(1);
  });

  it('a failed update leaves the stored drive as it was', async () => {
    const doc = named(DEMO_I4);
    const created = await create(doc);
    const res = await lead.send('put', `/api/engines/${created.id}`, { ...doc, components: [], version: 1 });
    expect(res.status).toBe(400);
    const again = await tech.get(`/api/engines/${created.id}`);
    expect(again.body.engine.components).toHaveLength(doc.components.length);
  });

  it('duplicates an engine under a new name', async () => {
    const created = await create(named(DEMO_V6));
    const res = await lead.post(`/api/engines/${created.id}/duplicate`);
    expect(res.status).toBe(201);
    expect(res.body.engine.name).toBe(`${created.name} (copy)`);
    expect(res.body.engine.components).toStrictEqual(created.components);
    const second = await lead.post(`/api/engines/${created.id}/duplicate`);
    expect(second.body.engine.name).toBe(`${created.name} (copy 2)`);
  });

  it('deletes an engine with its belts and components', async () => {
    const created = await create(named(DEMO_V6));
    const res = await lead.delete(`/api/engines/${created.id}`);
    expect(res.status).toBe(204);
    expect(await DriveComponent.count({ where: { engineId: created.id } })).toBe(0);
    expect(await Belt.count({ where: { engineId: created.id } })).toBe(0);
    expect((await tech.get(`/api/engines/${created.id}`)).status).toBe(404);
  });

  it('refuses to delete an engine a case uses with 409 engine_in_use, and keeps it', async () => {
    const created = await create(named(DEMO_I4));
    // Cases arrive with a later issue; it registers its counter the same way.
    const unregister = registerEngineUsage('case', async (_shopId, engineId) => (engineId === created.id ? 2 : 0));
    try {
      const res = await lead.delete(`/api/engines/${created.id}`);
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('engine_in_use');
      expect(res.body.error.message).toMatch(/2 case/);
      expect((await tech.get(`/api/engines/${created.id}`)).status).toBe(200);
    } finally {
      unregister();
    }
  });

  it("answers 404 for another shop's engine and 403 for a technician's write", async () => {
    const created = await create(named(DEMO_I4));
    expect((await otherAdmin.get(`/api/engines/${created.id}`)).status).toBe(404);
    expect((await otherAdmin.delete(`/api/engines/${created.id}`)).status).toBe(404);
    for (const agent of [tech, specialist]) {
      const res = await agent.send('put', `/api/engines/${created.id}`, named(DEMO_I4));
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
  });

  it('exports the analyze --drive document, with each designation\'s geometry and source beside it, that parseDriveDocument accepts', async () => {
    const created = await create(named(DEMO_I4));
    const res = await tech.get(`/api/engines/${created.id}/export.json`);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="?[a-z0-9-]+\.drive\.json/);
    const doc = parseDriveDocument(JSON.parse(res.text));
    const idler = doc.components.find((c) => c.name === 'Upper idler')!;
    // CWRU 6203: 8 balls, d 0.2656 in, D 1.122 in (docs/references.md §1), in millimetres, written as
    // entered (6.74624, not the 6.746239999999999 of binary arithmetic).
    expect(idler.bearing).toMatchObject({ designation: '6203', balls: 8, rotatingRing: 'outer', source: 'published' });
    expect(idler.bearing!.ballMm).toBe(6.74624);
    expect(idler.bearing!.pitchMm).toBe(28.4988);
    expect(res.text).not.toMatch(/\d{13}/);
    // Importing the export gives an engine with the same computed orders.
    const imported = await lead.post('/api/engines/import.json', { ...doc, name: `${doc.name} re-imported` });
    expect(imported.status).toBe(201);
    const orig = await tech.get(`/api/engines/${created.id}`);
    // Equal to the 12 significant digits the export writes.
    const flat = (e: { computed: { components: { orders: Record<string, number | null> }[] } }) => e.computed.components.flatMap((c) => Object.values(c.orders));
    const a = flat(orig.body.engine);
    const b = flat(imported.body.engine);
    expect(b.length).toBe(a.length);
    b.forEach((v, i) => (v === null ? expect(a[i]).toBeNull() : expect(v / (a[i] as number)).toBeCloseTo(1, 10)));
  });

  it('round-trips the whole engine through CSV export and import, and creates an engine from it', async () => {
    const created = await create({ ...named(DEMO_DIESEL_I4), notes: 'cam-driven vacuum pump' });
    const csv = await tech.get(`/api/engines/${created.id}/export.csv`);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    expect(csv.text.split('\r\n')[0]).toBe('[engine]');
    const res = await lead.send('post', `/api/engines/${created.id}/import.csv`).set('content-type', 'text/csv').send(csv.text);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.imported.rows).toBe(created.components.length + created.belts.length);
    const strip = ({ id: _i, updatedAt: _u, version: _v, computed: _c, ...rest }: Record<string, unknown>) => rest;
    expect(strip(res.body.engine)).toStrictEqual(strip(created as unknown as Record<string, unknown>));
    const fresh = await lead.send('post', '/api/engines/import.csv').set('content-type', 'text/csv').send(csv.text.replace(created.name, `${created.name} from CSV`));
    expect(fresh.status, JSON.stringify(fresh.body)).toBe(201);
    expect(fresh.body.engine.components).toStrictEqual(created.components);
    expect(fresh.body.engine.belts).toStrictEqual(created.belts);
    const table = await tech.get(`/api/engines/${created.id}/components.csv`);
    expect(table.text.split('\r\n')[0]).toBe(COMPONENT_CSV_HEADERS.join(','));
  });

  it('imports a CSV as a multipart file too', async () => {
    const created = await create(named(DEMO_I4));
    const rows = `${COMPONENT_CSV_HEADERS.join(',')}\nCrankshaft,crankshaft,,,,,,,,,,,,,,,\nAlternator,alternator,Main,58,,,,,,,,,,,,,inner\n`;
    const res = await lead.send('post', `/api/engines/${created.id}/import.csv`).attach('file', Buffer.from(rows), 'table.csv');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.engine.components).toEqual([
      { name: 'Crankshaft', kind: 'crankshaft' },
      { name: 'Alternator', kind: 'alternator', belt: 'Main', pulleyMm: 58, bearing: { rotatingRing: 'inner' } },
    ]);
  });

  it('reports every bad CSV row with its line and column in one pass, and imports nothing', async () => {
    const created = await create(named(DEMO_I4));
    const rows = [
      COMPONENT_CSV_HEADERS.join(','),
      'Crankshaft,crankshaft,,,,,,,,,,,,,,,',
      'Alternator,alternator,Main,abc,,,,,,,,,,,,,',
      'Idler,idler,Serpentine,70,,,,,,,,,,,,,outer',
      'Pump,water_pump,Main,500,,,,,,,,,,,,,',
    ].join('\n');
    const res = await lead.send('post', `/api/engines/${created.id}/import.csv`).set('content-type', 'text/csv').send(rows);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.message).toMatch(/nothing was imported/);
    const lines = res.body.error.details.map((d: { line: number; field: string }) => `${d.line}:${d.field}`);
    // The cell errors and the schema's range check (line 5) come together, not one after the other.
    expect(lines).toEqual(['3:pulleyMm', '4:belt', '5:pulleyMm']);
    expect(res.body.error.details.find((d: { line: number }) => d.line === 5).message).toBe('Pulley diameter must be between 20 and 400 mm (got 500)');
    expect(res.body.error.message).toMatch(/^Line 3, column pulleyMm: Pulley diameter must be a number/);
    const after = await tech.get(`/api/engines/${created.id}`);
    expect(after.body.engine.components).toStrictEqual(created.components);
  });

  it("goes with its shop: deleting a shop (DEMO=off removes the demo shop this way) removes its engines' rows", async () => {
    const doomed = await createTestShop();
    const admin = await t.signIn(doomed.users.admin.email, doomed.users.admin.password);
    const res = await admin.post('/api/engines', named(DEMO_V6));
    expect(res.status).toBe(201);
    await doomed.shop.destroy();
    expect(await Engine.count({ where: { shopId: doomed.shop.id } })).toBe(0);
    expect(await DriveComponent.count({ where: { shopId: doomed.shop.id } })).toBe(0);
    expect(await Belt.count({ where: { shopId: doomed.shop.id } })).toBe(0);
  });

  it('refuses a JSON import with every problem named by path', async () => {
    const res = await lead.post('/api/engines/import.json', { name: '', cylinders: 4, firingOrder: [1, 3, 4, 2], belts: [], components: [] });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['name', 'components']));
  });
});
