/**
 * The Drive library's engines: list, read, create, update, duplicate and delete, all scoped to
 * the user's shop. A body is validated as a whole drive document (shared/schemas/drive.ts) plus
 * the shop's rules (designations known, engine name free); every problem comes back at once as
 * 400 `validation_failed` with its JSON path. Writes run in one transaction.
 */
import { Op, type Transaction, type WhereOptions } from 'sequelize';
import { findBearing, type BearingGeometry } from '../../shared/drive/bearing-table';
import type { DriveDocument } from '../../shared/drive/types';
import { DriveDocumentError, parseDriveDocument } from '../../shared/schemas/drive';
import { EngineNotesSchema, type EngineListQuery } from '../../shared/schemas/engines-api';
import { AppError, notFound } from '../errors';
import { Belt } from '../models/belt';
import { DriveComponent } from '../models/drive-component';
import { Engine } from '../models/engine';
import { shopBearingTable } from './bearings';
import { clearDrive, firingOrderToText, loadDriveDocument, writeDrive } from './engine-drive';
import { countCasesUsingEngine } from './engine-usage';

/** A problem with an engine body: JSON path and message. */
export interface EngineIssue { path: string; message: string }

/** An engine document with the shop's notes. */
export type EngineDocument = DriveDocument & { notes?: string };

function sequelizeOf() {
  const s = Engine.sequelize;
  if (!s) throw new Error('models are not initialised (call initModels first)');
  return s;
}

/** 400 `validation_failed` listing every issue; the message names the first. */
export function engineValidationError(issues: EngineIssue[]): AppError {
  const first = issues[0];
  const more = issues.length > 1 ? ` (and ${issues.length - 1} more)` : '';
  return new AppError(400, 'validation_failed', `${first.path}: ${first.message}${more}`, issues);
}

/**
 * Validates a body as an engine of the shop: the drive schema, notes, and every bearing given only
 * by designation found in the shop's table or the built-in rows. Throws 400 with every issue.
 */
export function checkEngineDocument(body: unknown, shopTable: readonly BearingGeometry[]): EngineDocument {
  const issues: EngineIssue[] = [];
  let doc: DriveDocument | null = null;
  try {
    doc = parseDriveDocument(body);
  } catch (error) {
    if (!(error instanceof DriveDocumentError)) throw error;
    issues.push(...error.issues);
  }
  const rawNotes = (body as { notes?: unknown } | null)?.notes;
  const notes = EngineNotesSchema.safeParse(rawNotes ?? '');
  if (!notes.success) issues.push({ path: 'notes', message: notes.error.issues[0].message });
  if (doc) {
    doc.components.forEach((c, i) => {
      const b = c.bearing;
      const hasGeometry = b?.balls !== undefined && b.ballMm !== undefined && b.pitchMm !== undefined;
      if (b?.designation && !hasGeometry && !b.factors && !findBearing(b.designation, shopTable)) {
        issues.push({
          path: `components[${i}].bearing.designation`,
          message: `bearing "${b.designation}" is not in the shop's bearing table; add it on the Bearings page or give the geometry`,
        });
      }
    });
  }
  if (issues.length > 0 || !doc) throw engineValidationError(issues);
  const out: EngineDocument = { ...doc };
  delete out.notes;
  if (notes.success && notes.data) out.notes = notes.data;
  return out;
}

async function assertNameFree(shopId: number, name: string, exceptId: number | null, transaction?: Transaction) {
  const clash = await Engine.findOne({ where: { shopId, nameKey: name.trim().toLowerCase() }, transaction });
  if (clash && clash.id !== exceptId) {
    throw new AppError(409, 'engine_name_taken', `The shop already has an engine named "${clash.name}"; choose another name`,
      [{ path: 'name', message: `"${clash.name}" is already used by another engine` }]);
  }
}

function escapeLike(s: string): string {
  return s.replace(/[\\%_]/g, (m) => `\\${m}`);
}

/** One page of the shop's engines with their belt and component counts. */
export async function listEngines(shopId: number, query: EngineListQuery) {
  const where: WhereOptions = { shopId };
  if (query.search) Object.assign(where, { name: { [Op.like]: `%${escapeLike(query.search)}%` } });
  const desc = query.sort.startsWith('-');
  const field = query.sort.replace('-', '') === 'name' ? 'nameKey' : 'updatedAt';
  const dir = desc ? 'DESC' : 'ASC';
  const { rows, count } = await Engine.findAndCountAll({
    where, order: [[field, dir], ['id', dir]], limit: query.pageSize, offset: (query.page - 1) * query.pageSize,
  });
  const ids = rows.map((r) => r.id);
  const [beltCounts, componentCounts] = await Promise.all([countBy(Belt, ids), countBy(DriveComponent, ids)]);
  return {
    rows: rows.map((engine) => ({ engine, belts: beltCounts.get(engine.id) ?? 0, components: componentCounts.get(engine.id) ?? 0 })),
    total: count, page: query.page, pageSize: query.pageSize,
  };
}

async function countBy(model: typeof Belt | typeof DriveComponent, engineIds: number[]): Promise<Map<number, number>> {
  if (engineIds.length === 0) return new Map();
  const rows = (await (model as typeof Belt).findAll({
    where: { engineId: engineIds }, attributes: ['engineId', [sequelizeOf().fn('COUNT', sequelizeOf().col('id')), 'n']],
    group: ['engineId'], raw: true,
  })) as unknown as { engineId: number; n: number | string }[];
  return new Map(rows.map((r) => [Number(r.engineId), Number(r.n)]));
}

/** One engine of the shop; 404 when missing or another shop's. */
export async function findEngine(shopId: number, id: number, transaction?: Transaction): Promise<Engine> {
  const engine = await Engine.findOne({ where: { id, shopId }, transaction });
  if (!engine) throw notFound('Engine');
  return engine;
}

/** An engine with its document and the shop's bearing table (for the computed columns). */
export async function getEngine(shopId: number, id: number) {
  const engine = await findEngine(shopId, id);
  const [doc, shopTable] = await Promise.all([loadDriveDocument(engine), shopBearingTable(shopId)]);
  return { engine, doc, shopTable };
}

/** Creates an engine from a drive document body (201). */
export async function createEngine(shopId: number, body: unknown) {
  const shopTable = await shopBearingTable(shopId);
  const doc = checkEngineDocument(body, shopTable);
  const engine = await sequelizeOf().transaction(async (t) => {
    await assertNameFree(shopId, doc.name, null, t);
    const e = await Engine.create({
      shopId, name: doc.name.trim(), nameKey: doc.name.trim().toLowerCase(), cylinders: doc.cylinders,
      firingOrder: firingOrderToText(doc.firingOrder), idleRpm: doc.idleRpm ?? null, notes: doc.notes ?? '',
    }, { transaction: t });
    await writeDrive(e, doc, t);
    return e;
  });
  return { engine, doc: await loadDriveDocument(engine), shopTable };
}

/** Replaces an engine's document (name, cylinders, firing order, idle, notes, belts, components). */
export async function updateEngine(shopId: number, id: number, body: unknown) {
  const shopTable = await shopBearingTable(shopId);
  const doc = checkEngineDocument(body, shopTable);
  const engine = await sequelizeOf().transaction(async (t) => {
    const e = await findEngine(shopId, id, t);
    await assertNameFree(shopId, doc.name, e.id, t);
    e.set({
      name: doc.name.trim(), nameKey: doc.name.trim().toLowerCase(), cylinders: doc.cylinders,
      firingOrder: firingOrderToText(doc.firingOrder), idleRpm: doc.idleRpm ?? null, notes: doc.notes ?? '',
    });
    // The belts and components change in other tables: mark the engine as updated either way.
    e.changed('updatedAt', true);
    await e.save({ transaction: t });
    await writeDrive(e, doc, t);
    return e;
  });
  return { engine, doc: await loadDriveDocument(engine), shopTable };
}

/** Replaces only the components of an engine with an already validated document's. */
export async function replaceDrive(shopId: number, id: number, doc: DriveDocument) {
  const engine = await sequelizeOf().transaction(async (t) => {
    const e = await findEngine(shopId, id, t);
    e.changed('updatedAt', true);
    await e.save({ transaction: t });
    await writeDrive(e, doc, t);
    return e;
  });
  return { engine, doc: await loadDriveDocument(engine), shopTable: await shopBearingTable(shopId) };
}

/** Copies an engine under the first free name "<name> (copy)", "<name> (copy 2)", … */
export async function duplicateEngine(shopId: number, id: number) {
  const source = await findEngine(shopId, id);
  const doc = await loadDriveDocument(source);
  const taken = new Set((await Engine.findAll({ where: { shopId }, attributes: ['nameKey'] })).map((e) => e.nameKey));
  let name = '';
  for (let n = 1; ; n += 1) {
    const suffix = n === 1 ? ' (copy)' : ` (copy ${n})`;
    name = `${doc.name.slice(0, 100 - suffix.length)}${suffix}`;
    if (!taken.has(name.toLowerCase())) break;
  }
  return createEngine(shopId, { ...doc, name });
}

/** Deletes an engine and its drive, unless a case uses it (409 `engine_in_use`). */
export async function deleteEngine(shopId: number, id: number): Promise<void> {
  await sequelizeOf().transaction(async (t) => {
    const engine = await findEngine(shopId, id, t);
    const cases = await countCasesUsingEngine(shopId, engine.id, t);
    if (cases > 0) {
      throw new AppError(409, 'engine_in_use', `${cases} case(s) use "${engine.name}"; it cannot be deleted while they do (duplicate it to make a variant)`);
    }
    await clearDrive(engine.id, t);
    await engine.destroy({ transaction: t });
  });
}
