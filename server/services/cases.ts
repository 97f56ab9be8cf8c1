/**
 * Cases: create, list (paged, filtered, searched), read and update, all scoped to the user's shop
 * (issue 15 item 1). Writes lock the case row inside a transaction and carry its version
 * (optimistic concurrency: 409 `stale_write` when someone changed it since it was read).
 */
import { Op, type Transaction, type WhereOptions } from 'sequelize';
import type { CaseListQuery, CreateCase, UpdateCase, Vehicle } from '../../shared/schemas/cases';
import { AppError, notFound } from '../errors';
import { Capture } from '../models/capture';
import { Case } from '../models/case';
import { Engine } from '../models/engine';
import { Finding } from '../models/finding';
import { Shop } from '../models/shop';
import { User } from '../models/user';
import { appendTimeline } from './case-timeline';
import { registerEngineUsage } from './engine-usage';

/** The signed-in user as services need them. */
export interface Actor { id: number; shopId: number; role: string; name: string }

export function sequelizeOf() {
  const s = Case.sequelize;
  if (!s) throw new Error('models are not initialised (call initModels first)');
  return s;
}

/** "2017 Nordfahrt Kestrel" */
export function vehicleLabel(v: Vehicle): string {
  return [v.year ?? '', v.make, v.model].filter((x) => x !== '').join(' ');
}

function searchTextOf(roNumber: string, v: Vehicle, complaint: string): string {
  return [roNumber, v.year ?? '', v.make, v.model, v.vin ?? '', complaint].join(' ').toLowerCase();
}

function escapeLike(s: string): string {
  return s.replace(/[\\%_]/g, (m) => `\\${m}`);
}

/** Registers the case counter with the engine-usage registry: an engine a case uses cannot be deleted. */
export function registerCaseEngineUsage(): () => void {
  return registerEngineUsage('case', (shopId, engineId, transaction) => Case.count({ where: { shopId, engineId }, transaction }));
}

async function checkPeople(shopId: number, body: { engineId?: number | null; technicianId?: number | null; leadId?: number | null }, t: Transaction) {
  const issues: { path: string; message: string }[] = [];
  if (body.engineId != null && !(await Engine.findOne({ where: { id: body.engineId, shopId }, transaction: t }))) {
    issues.push({ path: 'engineId', message: 'Choose an engine from the Drive library' });
  }
  if (body.technicianId != null && !(await User.findOne({ where: { id: body.technicianId, shopId, active: true }, transaction: t }))) {
    issues.push({ path: 'technicianId', message: 'Choose a technician of the shop' });
  }
  if (body.leadId != null) {
    const lead = await User.findOne({ where: { id: body.leadId, shopId, active: true }, transaction: t });
    if (!lead || (lead.role !== 'lead' && lead.role !== 'admin')) issues.push({ path: 'leadId', message: 'Choose a lead technician (a lead or an admin) of the shop' });
  }
  if (issues.length) throw new AppError(400, 'validation_failed', `${issues[0].path}: ${issues[0].message}`, issues);
}

/** Creates a case (status open) and its `created` timeline entry. */
export async function createCase(actor: Actor, body: CreateCase): Promise<Case> {
  return sequelizeOf().transaction(async (t) => {
    const technicianId = body.technicianId === undefined ? actor.id : body.technicianId;
    // Shop setup's default lead and service advisor e-mail fill what the form left empty.
    const shop = await Shop.findByPk(actor.shopId, { transaction: t });
    let leadId = body.leadId;
    if (leadId === null && shop?.defaultLeadId) {
      const lead = await User.findOne({ where: { id: shop.defaultLeadId, shopId: actor.shopId, active: true }, transaction: t });
      if (lead && (lead.role === 'lead' || lead.role === 'admin')) leadId = lead.id;
    }
    const advisorEmail = body.advisorEmail || shop?.serviceAdvisorEmail || '';
    await checkPeople(actor.shopId, { engineId: body.engineId, technicianId, leadId }, t);
    const c = await Case.create({
      shopId: actor.shopId, roNumber: body.roNumber, vehicle: body.vehicle, engineId: body.engineId, complaint: body.complaint,
      technicianId, leadId, createdById: actor.id, advisorName: body.advisorName, advisorEmail,
      status: 'open', searchText: searchTextOf(body.roNumber, body.vehicle, body.complaint),
    }, { transaction: t });
    await appendTimeline({ shopId: actor.shopId, caseId: c.id, actorId: actor.id, kind: 'created', message: `${actor.name} opened the case for ${body.roNumber}` }, t);
    return c;
  });
}

/** Locks and returns a case of the shop (SELECT … FOR UPDATE), 404 otherwise. */
export async function lockCase(shopId: number, id: number, t: Transaction): Promise<Case> {
  const c = await Case.findOne({ where: { id, shopId }, transaction: t, lock: t.LOCK.UPDATE });
  if (!c) throw notFound('Case');
  return c;
}

/** Updates a case's fields; 409 `stale_write` when `version` is not the current one. */
export async function updateCase(actor: Actor, id: number, body: UpdateCase): Promise<Case> {
  return sequelizeOf().transaction(async (t) => {
    const c = await lockCase(actor.shopId, id, t);
    if (c.version !== body.version) {
      throw new AppError(409, 'stale_write', 'Someone changed this case since you opened it; reload it and apply your change again', { version: c.version });
    }
    if (c.status === 'closed') throw new AppError(409, 'case_closed', 'This case is closed; it can no longer be edited');
    if (body.engineId !== undefined && body.engineId !== c.engineId && (c.status === 'ranked' || c.status === 'confirmed' || c.status === 'verified')) {
      throw new AppError(409, 'case_ranked', 'The case is ranked against its engine; re-open it before choosing another engine');
    }
    await checkPeople(actor.shopId, body, t);
    const changed: string[] = [];
    for (const k of ['roNumber', 'vehicle', 'engineId', 'complaint', 'technicianId', 'leadId', 'advisorName', 'advisorEmail'] as const) {
      if (body[k] !== undefined && JSON.stringify(body[k]) !== JSON.stringify(c[k])) {
        (c as unknown as Record<string, unknown>)[k] = body[k];
        changed.push(k);
      }
    }
    if (changed.length === 0) return c;
    c.searchText = searchTextOf(c.roNumber, c.vehicle, c.complaint);
    c.version += 1;
    c.changed('vehicle', true);
    await c.save({ transaction: t });
    await appendTimeline({ shopId: actor.shopId, caseId: c.id, actorId: actor.id, kind: 'updated', message: `${actor.name} changed ${changed.join(', ')}`, data: { fields: changed } }, t);
    return c;
  });
}

/** One page of the shop's cases with what the list shows. */
export async function listCases(shopId: number, q: CaseListQuery) {
  const where: WhereOptions = { shopId };
  if (q.status.length) Object.assign(where, { status: q.status });
  if (q.technicianId) Object.assign(where, { technicianId: q.technicianId });
  if (q.leadId) Object.assign(where, { leadId: q.leadId });
  if (q.search) {
    const words = q.search.toLowerCase().split(/\s+/).filter(Boolean).slice(0, 8);
    Object.assign(where, { [Op.and]: words.map((w) => ({ searchText: { [Op.like]: `%${escapeLike(w)}%` } })) });
  }
  const desc = q.sort.startsWith('-');
  const field = q.sort.replace('-', '');
  const dir = desc ? 'DESC' : 'ASC';
  const { rows, count } = await Case.findAndCountAll({
    where, order: [[field, dir], ['id', dir]], limit: q.pageSize, offset: (q.page - 1) * q.pageSize,
    include: [{ association: 'engine', attributes: ['id', 'name'] }, { association: 'technician' }, { association: 'lead' }],
  });
  const ids = rows.map((r) => r.id);
  const captureCounts = new Map<number, number>();
  const tops = new Map<number, Finding>();
  if (ids.length) {
    const counts = (await Capture.findAll({
      where: { caseId: ids }, attributes: ['caseId', [sequelizeOf().fn('COUNT', sequelizeOf().col('id')), 'n']], group: ['caseId'], raw: true,
    })) as unknown as { caseId: number; n: number | string }[];
    for (const r of counts) captureCounts.set(Number(r.caseId), Number(r.n));
    const findings = await Finding.findAll({ where: { caseId: ids, inRanking: true, status: { [Op.ne]: 'dismissed' } }, order: [['rank', 'ASC']] });
    for (const f of findings) if (!tops.has(f.caseId)) tops.set(f.caseId, f);
  }
  return { rows: rows.map((c) => ({ c, captureCount: captureCounts.get(c.id) ?? 0, top: tops.get(c.id) ?? null })), total: count, page: q.page, pageSize: q.pageSize };
}

/** Who can be assigned: technicians = active users; leads = active leads and admins. */
export async function casePeople(shopId: number) {
  const users = await User.findAll({ where: { shopId, active: true }, order: [['name', 'ASC']] });
  return { technicians: users, leads: users.filter((u) => u.role === 'lead' || u.role === 'admin') };
}
