import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { QueryTypes, Sequelize } from 'sequelize';
import { createMigrator } from '../../../server/db/migrator';
import { BearingType, Shop } from '../../../server/models';
import { createShop } from '../../../server/services/create-shop';
import { seedPublishedBearings } from '../../../server/services/bearings';
import { DEMO_I4 } from '../../../server/db/seeders/demo-engines';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createTestShop, uniq, type TestShop } from '../../helpers/factories';

let t: TestApp;
let shop: TestShop;
let other: TestShop;
let admin: ApiAgent;
let tech: ApiAgent;
let otherLead: ApiAgent;

const row = (over: Record<string, unknown> = {}) => ({ designation: `MX${uniq()}`, balls: 9, ballMm: 7.5, pitchMm: 38, contactDeg: 0, source: 'measured', notes: 'measured on a spare part', ...over });

beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
  other = await createTestShop();
  await seedPublishedBearings(shop.shop.id);
  admin = await t.signIn(shop.users.admin.email, shop.users.admin.password);
  tech = await t.signIn(shop.users.tech.email, shop.users.tech.password);
  otherLead = await t.signIn(other.users.lead.email, other.users.lead.password);
});
afterAll(async () => t.close());

describe('bearings API', () => {
  it('requires authentication', async () => {
    const res = await (await t.agent()).get('/api/bearings');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('lists the published CWRU rows a shop is seeded with, with their defect factors', async () => {
    const res = await tech.get('/api/bearings');
    expect(res.status).toBe(200);
    const r6205 = res.body.items.find((b: { designation: string }) => b.designation === '6205');
    expect(r6205).toMatchObject({ balls: 9, source: 'published', contactDeg: 0 });
    // CWRU Bearing Data Center, drive end 6205-2RS: BPFI 5.4152, BPFO 3.5848, FTF 0.39828, 2×BSF 4.7135
    // (docs/references.md §1, published; relative tolerance 1e-4 on this row).
    const rel = (v: number, ref: number) => Math.abs(v / ref - 1);
    expect(rel(r6205.factors.bpfi, 5.4152)).toBeLessThan(1e-4);
    expect(rel(r6205.factors.bpfo, 3.5848)).toBeLessThan(1e-4);
    expect(rel(r6205.factors.ftf, 0.39828)).toBeLessThan(1e-4);
    expect(rel(2 * r6205.factors.bsf, 4.7135)).toBeLessThan(1e-4);
    expect(res.body.items.some((b: { designation: string }) => b.designation === '6203')).toBe(true);
  });

  it('seeds the published rows when a shop is created (set-up and create-shop path)', async () => {
    const { shop: fresh } = await createShop(t.sequelize, { name: `Fresh ${uniq()}`, users: [{ name: 'Ada Admin', email: `ada.${uniq()}@example.test`, password: 'long-enough-pw', role: 'admin' }] }, 4);
    const rows = await BearingType.findAll({ where: { shopId: fresh.id } });
    expect(rows.map((r) => r.designation).sort()).toEqual(['6203', '6205']);
    expect(rows.every((r) => r.source === 'published')).toBe(true);
    await Shop.destroy({ where: { id: fresh.id } });
  });

  it('gives shops that existed before the bearing_types migration the published rows too', async () => {
    // A bare instance on the scratch database (the models stay bound to the shared test database).
    const scratch = new Sequelize(inject('scratchDatabaseUrl'), { dialect: 'mariadb', logging: false, timezone: '+00:00' });
    try {
      const migrator = createMigrator(scratch);
      await migrator.up();
      await migrator.down({ to: '202612020400-create-bearing-types' });
      await scratch.query("INSERT INTO shops (name, isDemo, createdAt, updatedAt) VALUES ('Older shop', 0, NOW(), NOW())");
      await migrator.up();
      const rows = await scratch.query<{ designation: string; source: string }>(
        "SELECT b.designation, b.source FROM bearing_types b JOIN shops s ON s.id = b.shopId WHERE s.name = 'Older shop' ORDER BY b.designation",
        { type: QueryTypes.SELECT },
      );
      expect(rows).toEqual([{ designation: '6203', source: 'published' }, { designation: '6205', source: 'published' }]);
    } finally {
      await scratch.query("DELETE FROM shops WHERE name = 'Older shop'").catch(() => undefined);
      await scratch.close();
    }
  });

  it('creates, edits and deletes a row', async () => {
    const body = row();
    const created = await admin.post('/api/bearings', body);
    expect(created.status).toBe(201);
    expect(created.body.bearing).toMatchObject({ ...body, usedBy: 0 });
    const id = created.body.bearing.id;
    const edited = await admin.send('put', `/api/bearings/${id}`, { ...body, balls: 10, source: 'estimated' });
    expect(edited.status).toBe(200);
    expect(edited.body.bearing).toMatchObject({ balls: 10, source: 'estimated' });
    expect((await admin.delete(`/api/bearings/${id}`)).status).toBe(204);
    expect(await BearingType.findByPk(id)).toBeNull();
  });

  it('answers 400 validation_failed naming the field, and 409 for a designation already in the table', async () => {
    const bad = await admin.post('/api/bearings', row({ ballMm: 50, pitchMm: 30 }));
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_failed');
    expect(bad.body.error.details.map((d: { path: string }) => d.path)).toContain('ballMm');
    const source = await admin.post('/api/bearings', row({ source: 'guessed' }));
    expect(source.status).toBe(400);
    expect(source.body.error.details[0].path).toBe('source');
    const dup = await admin.post('/api/bearings', row({ designation: '6203-2RS' }));
    expect(dup.status).toBe(409);
    expect(dup.body.error.code).toBe('designation_taken');
  });

  it('refuses to delete or rename a bearing a component names (409 bearing_in_use)', async () => {
    const body = row();
    const created = await admin.post('/api/bearings', body);
    const id = created.body.bearing.id;
    const doc = { ...DEMO_I4, name: `Uses ${body.designation}`, components: DEMO_I4.components.map((c) => (c.name === 'Tensioner' ? { ...c, bearing: { designation: body.designation, rotatingRing: 'outer' as const } } : c)) };
    expect((await admin.post('/api/engines', doc)).status).toBe(201);
    const list = await tech.get('/api/bearings');
    expect(list.body.items.find((b: { id: number }) => b.id === id).usedBy).toBe(1);
    const del = await admin.delete(`/api/bearings/${id}`);
    expect(del.status).toBe(409);
    expect(del.body.error.code).toBe('bearing_in_use');
    const rename = await admin.send('put', `/api/bearings/${id}`, { ...body, designation: `${body.designation}X` });
    expect(rename.status).toBe(409);
    expect(await BearingType.findByPk(id)).not.toBeNull();
  });

  it("answers 404 for another shop's bearing and 403 for a technician's write", async () => {
    const created = await admin.post('/api/bearings', row());
    const id = created.body.bearing.id;
    expect((await otherLead.delete(`/api/bearings/${id}`)).status).toBe(404);
    expect((await otherLead.send('put', `/api/bearings/${id}`, row())).status).toBe(404);
    const res = await tech.post('/api/bearings', row());
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
  });
});
