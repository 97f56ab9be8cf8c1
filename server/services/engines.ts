/**
 * The Drive library's engines: list, read, create, update, duplicate and delete, all scoped to
 * the user's shop. A body is validated as a whole drive document (shared/schemas/drive.ts) plus
 * the shop's rules (designations known, engine name free); every problem comes back at once as
 * 400 `validation_failed` with its JSON path and a message in the user's words.
 *
 * Concurrency (STYLE.md §5): an engine is read with its belts and components in one transaction
 * (one snapshot). Every write runs in one transaction that first locks the shop's row, so writes
 * to one shop's engines and bearing table happen one at a time: the name check, the "(copy n)"
 * choice and the bearing references are checked where no other write can change them. A write
 * names the `version` it edited; when the engine moved on since, it is refused with 409
 * `stale_write`. Every write raises the version and records what changed (engine_revisions).
 */
import { Op, UniqueConstraintError, type Transaction, type WhereOptions } from 'sequelize';
import { findBearing, type BearingGeometry } from '../../shared/drive/bearing-table';
import type { DriveDocument } from '../../shared/drive/types';
import { diffEngines } from '../../shared/drive-io/engine-diff';
import { DriveDocumentError, parseDriveDocument } from '../../shared/schemas/drive';
import { EngineNotesSchema, type EngineListQuery } from '../../shared/schemas/engines-api';
import { nameFoldKey } from '../../shared/schemas/names';
import { AppError, notFound } from '../errors';
import { Belt } from '../models/belt';
import { DriveComponent } from '../models/drive-component';
import { Engine } from '../models/engine';
import { EngineRevision } from '../models/engine-revision';
import { shopBearingTable } from './bearings';
import { lockShop } from './shop-lock';
import { clearDrive, firingOrderToText, loadDriveDocument, writeDrive } from './engine-drive';
import { countCasesUsingEngine } from './engine-usage';

/** A problem with an engine body: JSON path and message. */
export interface EngineIssue { path: string; message: string }

/** An engine document with the shop's notes. */
export type EngineDocument = DriveDocument & { notes?: string };

/** Who is writing (recorded in the edit history). */
export interface EngineWriter { id: number | null; name: string }

/** What a write does, for the edit history. */
export type EngineAction = 'create' | 'update' | 'import' | 'duplicate';

function sequelizeOf() {
  const s = Engine.sequelize;
  if (!s) throw new Error('models are not initialised (call initModels first)');
  return s;
}

/** 400 `validation_failed` listing every issue; the message names the first in the user's words. */
export function engineValidationError(issues: EngineIssue[]): AppError {
  const first = issues[0];
  const more = issues.length > 1 ? ` (and ${issues.length - 1} more)` : '';
  return new AppError(400, 'validation_failed', `${first.message}${more}`, issues);
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
          message: `Bearing "${b.designation}" is not in the shop's bearing table; add it on the Bearings page or give the geometry`,
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

/** The name check, inside the writing transaction; names equal under the collation (case, accents) clash. */
async function assertNameFree(shopId: number, name: string, exceptId: number | null, transaction: Transaction) {
  const fold = nameFoldKey(name);
  const candidates = await Engine.findAll({ where: { shopId, nameKey: name.trim().toLowerCase() }, transaction });
  // The database compares nameKey with its own collation; the fold catches the accent-equal ones it may not.
  const all = candidates.length > 0 ? candidates : (await Engine.findAll({ where: { shopId }, attributes: ['id', 'name'], transaction })).filter((e) => nameFoldKey(e.name) === fold);
  const clash = all.find((e) => e.id !== exceptId);
  if (clash) {
    throw new AppError(409, 'engine_name_taken', `The shop already has an engine named "${clash.name}"; choose another name`,
      [{ path: 'name', message: `"${clash.name}" is already the name of another engine (names are compared ignoring case and accents)` }]);
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
  return sequelizeOf().transaction(async (transaction) => {
    const { rows, count } = await Engine.findAndCountAll({
      where, order: [[field, dir], ['id', dir]], limit: query.pageSize, offset: (query.page - 1) * query.pageSize, transaction,
    });
    const ids = rows.map((r) => r.id);
    const beltCounts = await countBy(Belt, ids, transaction);
    const componentCounts = await countBy(DriveComponent, ids, transaction);
    return {
      rows: rows.map((engine) => ({ engine, belts: beltCounts.get(engine.id) ?? 0, components: componentCounts.get(engine.id) ?? 0 })),
      total: count, page: query.page, pageSize: query.pageSize,
    };
  });
}

async function countBy(model: typeof Belt | typeof DriveComponent, engineIds: number[], transaction: Transaction): Promise<Map<number, number>> {
  if (engineIds.length === 0) return new Map();
  const rows = (await (model as typeof Belt).findAll({
    where: { engineId: engineIds }, attributes: ['engineId', [sequelizeOf().fn('COUNT', sequelizeOf().col('id')), 'n']],
    group: ['engineId'], raw: true, transaction,
  })) as unknown as { engineId: number; n: number | string }[];
  return new Map(rows.map((r) => [Number(r.engineId), Number(r.n)]));
}

/** One engine of the shop; 404 when missing or another shop's. */
export async function findEngine(shopId: number, id: number, transaction?: Transaction, lock = false): Promise<Engine> {
  const engine = await Engine.findOne({ where: { id, shopId }, transaction, ...(lock && transaction ? { lock: transaction.LOCK.UPDATE } : {}) });
  if (!engine) throw notFound('Engine');
  return engine;
}

/** An engine with its document and the shop's bearing table, read in one transaction (one snapshot). */
export async function getEngine(shopId: number, id: number) {
  return sequelizeOf().transaction(async (t) => {
    const engine = await findEngine(shopId, id, t);
    const doc = await loadDriveDocument(engine, t);
    const shopTable = await shopBearingTable(shopId, t);
    return { engine, doc, shopTable };
  });
}

/** 409 `stale_write`: the engine moved on since the writer read it. */
export function staleWrite(engine: Engine): AppError {
  return new AppError(409, 'stale_write', `"${engine.name}" was changed by someone else since you opened it (now version ${engine.version}); reload it and make your change again`,
    { version: engine.version });
}

/** Reads the expected version a write names; 400 when it is missing or not a whole number. */
export function expectedVersionOf(body: unknown): number {
  const v = body && typeof body === 'object' ? (body as { version?: unknown }).version : undefined;
  if (typeof v === 'number' && Number.isInteger(v) && v >= 1) return v;
  throw new AppError(400, 'validation_failed', 'Send the version of the engine you edited (reload the page and try again)',
    [{ path: 'version', message: 'the version you edited is missing' }]);
}

interface WriteSpec {
  shopId: number;
  writer: EngineWriter;
  action: EngineAction;
  /** The engine to replace, and the version the writer edited (undefined = do not check). */
  id?: number;
  expectedVersion?: number;
  /** Builds the new document from the current one (read under the lock) and the shop's bearing table. */
  build: (current: EngineDocument | null, shopTable: BearingGeometry[], t: Transaction) => Promise<unknown> | unknown;
}

/** The one write path: lock, check the version, validate against the bearing table read under the lock, write, record. */
async function writeEngine(spec: WriteSpec) {
  const { shopId } = spec;
  try {
    return await sequelizeOf().transaction(async (t) => {
      await lockShop(shopId, t);
      let engine: Engine | null = null;
      let before: EngineDocument | null = null;
      if (spec.id !== undefined) {
        engine = await findEngine(shopId, spec.id, t, true);
        if (spec.expectedVersion !== undefined && engine.version !== spec.expectedVersion) throw staleWrite(engine);
        before = await loadDriveDocument(engine, t);
      }
      const shopTable = await shopBearingTable(shopId, t);
      const doc = checkEngineDocument(await spec.build(before, shopTable, t), shopTable);
      await assertNameFree(shopId, doc.name, engine?.id ?? null, t);
      const fields = {
        name: doc.name, nameKey: doc.name.toLowerCase(), cylinders: doc.cylinders,
        firingOrder: firingOrderToText(doc.firingOrder), idleRpm: doc.idleRpm ?? null, notes: doc.notes ?? '',
      };
      if (engine) {
        engine.set({ ...fields, version: engine.version + 1 });
        // The belts and components change in other tables: mark the engine as updated either way.
        engine.changed('updatedAt', true);
        await engine.save({ transaction: t });
      } else {
        engine = await Engine.create({ shopId, ...fields, version: 1 }, { transaction: t });
      }
      await writeDrive(engine, doc, t);
      const after = await loadDriveDocument(engine, t);
      await EngineRevision.create({
        shopId, engineId: engine.id, version: engine.version, userId: spec.writer.id, userName: spec.writer.name.slice(0, 100),
        action: spec.action, changes: JSON.stringify(diffEngines(before, after)),
      }, { transaction: t });
      return { engine, doc: after, shopTable };
    });
  } catch (error) {
    // Names the database holds equal that the checks above let through (its collation is wider):
    // a field error, never a 409 naming an index.
    if (error instanceof UniqueConstraintError) {
      throw new AppError(400, 'validation_failed', 'Two names are equal for the database (they differ only by case or accents); rename one',
        [{ path: 'components', message: 'Two part or belt names differ only by case or accents; rename one' }]);
    }
    throw error;
  }
}

/** Creates an engine from a drive document body (201). */
export async function createEngine(shopId: number, body: unknown, writer: EngineWriter = { id: null, name: 'system' }, action: EngineAction = 'create') {
  return writeEngine({ shopId, writer, action, build: () => body });
}

/** Replaces an engine's document (name, cylinders, firing order, idle, notes, belts, components); the body names the version it edited. */
export async function updateEngine(shopId: number, id: number, body: unknown, writer: EngineWriter = { id: null, name: 'system' }) {
  const expectedVersion = expectedVersionOf(body);
  const doc = body && typeof body === 'object' ? { ...(body as Record<string, unknown>) } : body;
  if (doc && typeof doc === 'object') delete (doc as Record<string, unknown>).version;
  return writeEngine({ shopId, writer, action: 'update', id, expectedVersion, build: () => doc });
}

/** Replaces an engine with a document built from the current one (CSV import). */
export async function replaceEngine(
  shopId: number, id: number, expectedVersion: number | undefined, writer: EngineWriter,
  build: (current: EngineDocument) => unknown,
) {
  return writeEngine({ shopId, writer, action: 'import', id, expectedVersion, build: (current) => build(current!) });
}

/** Copies an engine under the first free name "<name> (copy)", "<name> (copy 2)", …, chosen under the shop's lock. */
export async function duplicateEngine(shopId: number, id: number, writer: EngineWriter = { id: null, name: 'system' }) {
  return writeEngine({
    shopId, writer, action: 'duplicate',
    build: async (_current, _table, t) => {
      const source = await findEngine(shopId, id, t);
      const doc = await loadDriveDocument(source, t);
      const taken = new Set((await Engine.findAll({ where: { shopId }, attributes: ['name'], transaction: t })).map((e) => nameFoldKey(e.name)));
      for (let n = 1; ; n += 1) {
        const suffix = n === 1 ? ' (copy)' : ` (copy ${n})`;
        const name = `${Array.from(doc.name).slice(0, 100 - suffix.length).join('').trim()}${suffix}`;
        if (!taken.has(nameFoldKey(name))) return { ...doc, name };
      }
    },
  });
}

/** Deletes an engine and its drive, unless a case uses it (409 `engine_in_use`). */
export async function deleteEngine(shopId: number, id: number): Promise<void> {
  await sequelizeOf().transaction(async (t) => {
    await lockShop(shopId, t);
    const engine = await findEngine(shopId, id, t, true);
    const cases = await countCasesUsingEngine(shopId, engine.id, t);
    if (cases > 0) {
      throw new AppError(409, 'engine_in_use', `${cases} case(s) use "${engine.name}"; it cannot be deleted while they do (duplicate it to make a variant)`);
    }
    await clearDrive(engine.id, t);
    await engine.destroy({ transaction: t });
  });
}

/** The edit history of an engine, newest first (at most `limit` saves). */
export async function engineHistory(shopId: number, id: number, limit = 50) {
  return sequelizeOf().transaction(async (t) => {
    await findEngine(shopId, id, t);
    return EngineRevision.findAll({ where: { shopId, engineId: id }, order: [['version', 'DESC'], ['id', 'DESC']], limit, transaction: t });
  });
}
