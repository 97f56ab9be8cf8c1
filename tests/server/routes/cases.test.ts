// The Cases API: create with field errors, list with filters and search, optimistic concurrency,
// every illegal status move answered 409 with the moves allowed, concurrent decisions, and the
// engine-usage rule (an engine a case uses cannot be deleted).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_I4 } from '../../../server/db/seeders/demo-engines';
import { createEngine } from '../../../server/services/engines';
import { CASE_MOVES, CASE_STATUSES, type CaseStatus } from '../../../shared/schemas/cases';
import { createCaseRow, createFindingRow } from '../../helpers/case-factories';
import { createTestShop, uniq, type TestShop } from '../../helpers/factories';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';

let t: TestApp;
let shop: TestShop;
let other: TestShop;
let tech: ApiAgent;
let lead: ApiAgent;
let admin: ApiAgent;
let engineId: number;

beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
  other = await createTestShop();
  tech = await t.signIn(shop.users.tech.email, shop.users.tech.password);
  lead = await t.signIn(shop.users.lead.email, shop.users.lead.password);
  admin = await t.signIn(shop.users.admin.email, shop.users.admin.password);
  engineId = (await createEngine(shop.shop.id, { ...DEMO_I4, name: `Demo I4 ${uniq()}` })).engine.id;
});
afterAll(async () => t?.close());

const body = (extra: Record<string, unknown> = {}) => ({
  roNumber: `RO-${uniq()}`, vehicle: { year: 2018, make: 'Aldercrest', model: 'Tern', vin: '' }, complaint: 'Squeal on start-up', engineId, ...extra,
});

describe('create, read, list, update', () => {
  it('opens a case with the creator as technician and a created timeline entry', async () => {
    const res = await tech.post('/api/cases', body({ leadId: shop.users.lead.user.id }));
    expect(res.status).toBe(201);
    const c = res.body.case;
    expect(c.status).toBe('open');
    expect(c.technician.id).toBe(shop.users.tech.user.id);
    expect(c.lead.id).toBe(shop.users.lead.user.id);
    expect(c.vehicleLabel).toBe('2018 Aldercrest Tern');
    expect(c.vehicle.vin).toBeNull();
    expect(c.allowedMoves).toEqual(['testing']);
    expect(c.rankable.ok).toBe(false);
    expect(c.timeline).toHaveLength(1);
    expect(c.timeline[0].kind).toBe('created');
  });

  it('names the field in words a technician uses when the body is wrong', async () => {
    const missing = await tech.post('/api/cases', body({ roNumber: '  ' }));
    expect(missing.status).toBe(400);
    expect(missing.body.error.code).toBe('validation_failed');
    expect(missing.body.error.message).toContain('roNumber');
    expect(missing.body.error.message).toContain('repair order number');
    const vin = await tech.post('/api/cases', body({ vehicle: { make: 'A', model: 'B', vin: 'IOQ12345678901234' } }));
    expect(vin.body.error.message).toContain('VIN');
    const foreignEngine = await tech.post('/api/cases', body({ engineId: (await createEngine(other.shop.id, { ...DEMO_I4, name: `X ${uniq()}` })).engine.id }));
    expect(foreignEngine.status).toBe(400);
    expect(foreignEngine.body.error.message).toContain('engineId');
    const techAsLead = await tech.post('/api/cases', body({ leadId: shop.users.tech.user.id }));
    expect(techAsLead.status).toBe(400);
    expect(techAsLead.body.error.message).toContain('lead');
  });

  it('lists the shop\'s cases filtered by status and searched by vehicle and complaint', async () => {
    const ro = `RO-${uniq()}`;
    await tech.post('/api/cases', body({ roNumber: ro, vehicle: { make: 'Quillmoor', model: 'Heron' }, complaint: 'Grinding with the A/C on' }));
    const found = await tech.get('/api/cases?search=quillmoor%20grinding');
    expect(found.status).toBe(200);
    expect(found.body.items.map((x: { roNumber: string }) => x.roNumber)).toEqual([ro]);
    const byStatus = await tech.get('/api/cases?status=open,testing&pageSize=1');
    expect(byStatus.body.items).toHaveLength(1);
    expect(byStatus.body.total).toBeGreaterThanOrEqual(2);
    expect((await tech.get('/api/cases?status=nonsense')).status).toBe(400);
    const theirs = await t.signIn(other.users.tech.email, other.users.tech.password);
    expect((await theirs.get('/api/cases?search=quillmoor')).body.items).toEqual([]);
  });

  it('refuses a stale write with 409 stale_write and applies a current one', async () => {
    const c = (await tech.post('/api/cases', body())).body.case;
    const ok = await tech.patch(`/api/cases/${c.id}`, { version: c.version, complaint: 'Squeal only when cold' });
    expect(ok.status).toBe(200);
    expect(ok.body.case.complaint).toBe('Squeal only when cold');
    expect(ok.body.case.version).toBe(c.version + 1);
    const stale = await lead.patch(`/api/cases/${c.id}`, { version: c.version, complaint: 'Something else' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale_write');
    expect(ok.body.case.timeline.at(-1).kind).toBe('updated');
  });

  it('lists who can be assigned', async () => {
    const res = await tech.get('/api/cases/people');
    expect(res.body.technicians).toHaveLength(4);
    expect(res.body.leads.map((p: { role: string }) => p.role).sort()).toEqual(['admin', 'lead']);
  });

  it('keeps an engine a case uses from being deleted', async () => {
    const res = await admin.delete(`/api/engines/${engineId}`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('engine_in_use');
  });
});

describe('status moves', () => {
  const actions: { path: string; to: CaseStatus; body?: Record<string, unknown> }[] = [
    { path: 'complete', to: 'ranked' },
    { path: 'confirm', to: 'confirmed', body: { component: 'Alternator', note: 'rough by hand' } },
    { path: 'reopen', to: 'testing' },
    { path: 'verify', to: 'verified' },
    { path: 'close', to: 'closed' },
  ];
  for (const from of CASE_STATUSES) {
    for (const action of actions) {
      // open → testing is automatic (first capture), never the re-open action.
      const legal = CASE_MOVES[from].includes(action.to) && !(from === 'open' && action.path === 'reopen');
      if (legal) continue;
      it(`refuses ${action.path} on a ${from} case with 409 illegal_move`, async () => {
        const c = await createCaseRow(shop.shop, { status: from, engineId });
        const res = await lead.post(`/api/cases/${c.id}/${action.path}`, action.body ?? {});
        expect(res.status, JSON.stringify(res.body)).toBe(409);
        expect(res.body.error.code).toBe('illegal_move');
        if (from !== 'open') {
          const allowed = CASE_MOVES[from];
          for (const s of allowed) expect(res.body.error.message).toContain(s);
        }
        expect((await lead.get(`/api/cases/${c.id}`)).body.case.status).toBe(from);
      });
    }
  }

  it('walks ranked → confirmed → verified → closed, and ranked/confirmed back to testing', async () => {
    const c = await createCaseRow(shop.shop, { status: 'ranked', engineId });
    const f = await createFindingRow(shop.shop, c);
    const confirmed = await lead.post(`/api/cases/${c.id}/confirm`, { findingId: f.id, note: 'bearing rough with the belt off' });
    expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(200);
    expect(confirmed.body.case.status).toBe('confirmed');
    expect(confirmed.body.case.confirmed).toEqual(expect.objectContaining({ component: 'Alternator', findingId: f.id, note: 'bearing rough with the belt off' }));
    expect(confirmed.body.case.findings[0].status).toBe('confirmed');
    const reopened = await lead.post(`/api/cases/${c.id}/reopen`, { note: 'second probe point' });
    expect(reopened.body.case.status).toBe('testing');
    const d = await createCaseRow(shop.shop, { status: 'confirmed', engineId });
    expect((await lead.post(`/api/cases/${d.id}/verify`, {})).body.case.status).toBe('verified');
    const closed = await lead.post(`/api/cases/${d.id}/close`, { note: 'customer happy' });
    expect(closed.body.case.status).toBe('closed');
    expect(closed.body.case.timeline.map((e: { kind: string }) => e.kind)).toEqual(['verified', 'closed']);
    expect((await tech.patch(`/api/cases/${d.id}`, { version: closed.body.case.version, complaint: 'x' })).body.error.code).toBe('case_closed');
  });

  it('refuses to rank a testing case without an engine (409 engine_required) or without captures', async () => {
    const noEngine = await createCaseRow(shop.shop, { status: 'testing' });
    const res = await tech.post(`/api/cases/${noEngine.id}/complete`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('engine_required');
    const empty = await createCaseRow(shop.shop, { status: 'testing', engineId });
    expect((await tech.post(`/api/cases/${empty.id}/complete`)).body.error.code).toBe('no_usable_capture');
  });

  it('lets only one of two leads confirming at once succeed (the case row is locked)', async () => {
    const c = await createCaseRow(shop.shop, { status: 'ranked', engineId });
    const second = await t.signIn(shop.users.admin.email, shop.users.admin.password);
    const [a, b] = await Promise.all([
      lead.post(`/api/cases/${c.id}/confirm`, { component: 'Water pump', note: 'weeping seal' }),
      second.post(`/api/cases/${c.id}/confirm`, { component: 'Tensioner', note: 'arm chatter' }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const detail = (await lead.get(`/api/cases/${c.id}`)).body.case;
    expect(detail.timeline.filter((e: { kind: string }) => e.kind === 'confirmed')).toHaveLength(1);
  });

  it('refuses a technician the sign-off actions (403) and a dismissal on an open case (409)', async () => {
    const c = await createCaseRow(shop.shop, { status: 'ranked', engineId });
    expect((await tech.post(`/api/cases/${c.id}/confirm`, { component: 'A', note: 'b' })).status).toBe(403);
    const open = await createCaseRow(shop.shop, { status: 'open', engineId });
    const f = await createFindingRow(shop.shop, open);
    const res = await lead.post(`/api/findings/${f.id}/dismiss`, { note: 'not it' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('illegal_move');
  });
});
