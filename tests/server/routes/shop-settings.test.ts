import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_BACKSIDE_OFFSET_MM, DEFAULT_GROOVED_OFFSET_MM } from '../../../shared/drive/measured-diameter';
import { AnalysisSettingsSchema } from '../../../shared/schemas/analysis-settings';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createTestShop, createUser, type TestShop } from '../../helpers/factories';

let t: TestApp;
let shop: TestShop;
let admin: ApiAgent;
let tech: ApiAgent;

beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
  admin = await t.signIn(shop.users.admin.email, shop.users.admin.password);
  tech = await t.signIn(shop.users.tech.email, shop.users.tech.password);
});
afterAll(async () => t.close());

const full = () => ({
  name: 'Quarry Road Garage', address: '12 Quarry Road, Millbrook', phone: '+1 555 0100', defaultLeadId: shop.users.lead.user.id,
  serviceAdvisorEmail: 'Advisor@Example.test', analysisDefaults: { envelopeBand: [2000, 8000], envelopeMaxHz: 12000, samplesPerRev: 512, revsPerBlock: 16 },
  groovedOffsetMm: 2.5, backsideOffsetMm: 3.2, pulleyUnit: 'inch',
});

describe('shop settings API', () => {
  it('requires authentication', async () => {
    const res = await (await t.agent()).get('/api/shop/settings');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('gives the defaults of a new shop: AnalysisSettingsSchema defaults and the estimated offsets', async () => {
    const res = await tech.get('/api/shop/settings');
    expect(res.status).toBe(200);
    const defaults = AnalysisSettingsSchema.parse({});
    expect(res.body.settings).toMatchObject({
      name: shop.shop.name, address: '', phone: '', defaultLeadId: null, serviceAdvisorEmail: '', pulleyUnit: 'mm',
      groovedOffsetMm: DEFAULT_GROOVED_OFFSET_MM, backsideOffsetMm: DEFAULT_BACKSIDE_OFFSET_MM,
      analysisDefaults: { envelopeBand: defaults.envelopeBand, envelopeMaxHz: defaults.envelopeMaxHz, samplesPerRev: defaults.samplesPerRev, revsPerBlock: defaults.revsPerBlock },
    });
    expect(res.body.settings.leads.map((l: { id: number }) => l.id).sort()).toEqual([shop.users.admin.user.id, shop.users.lead.user.id].sort());
  });

  it('lets the admin save every field and everyone read them back; a technician cannot save', async () => {
    const saved = await admin.send('put', '/api/shop/settings', full());
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    const read = (await tech.get('/api/shop/settings')).body.settings;
    expect(read).toMatchObject({ ...full(), serviceAdvisorEmail: 'advisor@example.test' });
    const refused = await tech.send('put', '/api/shop/settings', full());
    expect(refused.status).toBe(403);
  });

  it('answers 400 in plain words for a bad e-mail, a control character, an offset out of range or a lead of another role', async () => {
    const cases: [Record<string, unknown>, RegExp][] = [
      [{ serviceAdvisorEmail: 'not-an-address' }, /e-mail address/],
      [{ phone: '555\u00070100' }, /one line/],
      [{ groovedOffsetMm: 40 }, /between -10 and 10 mm/],
      [{ analysisDefaults: { samplesPerRev: 300 } }, /power of two/],
      [{ defaultLeadId: shop.users.tech.user.id }, /active lead technician or admin/],
    ];
    for (const [patch, message] of cases) {
      const res = await admin.send('put', '/api/shop/settings', { ...full(), ...patch });
      expect(res.status, JSON.stringify(patch)).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(JSON.stringify(res.body.error)).toMatch(message);
    }
    const deactivated = await createUser(shop.shop, 'lead', { active: false });
    const res = await admin.send('put', '/api/shop/settings', { ...full(), defaultLeadId: deactivated.user.id });
    expect(res.status).toBe(400);
  });
});
