/**
 * Storing a drive document in the engine tables and reading it back. The belts and components of
 * an engine are always written as a whole (replace), inside the caller's transaction, so a drive
 * is never half-written. Belts and components refer to each other (a component rides a belt; a
 * belt is driven by a component), so belts are inserted first and linked to their driver last.
 */
import type { Transaction } from 'sequelize';
import type { BearingSpec, ComponentSpec, DriveDocument } from '../../shared/drive/types';
import { Belt } from '../models/belt';
import { DriveComponent } from '../models/drive-component';
import { Engine } from '../models/engine';

const key = (name: string): string => name.trim().toLowerCase();
const opt = <T>(v: T | null | undefined): T | undefined => (v === null ? undefined : v);

/** Firing order as stored ("1-3-4-2"). */
export function firingOrderToText(order: readonly number[]): string {
  return order.join('-');
}

/** Firing order from its stored text. */
export function firingOrderFromText(text: string): number[] {
  return text.split('-').filter(Boolean).map(Number);
}

function componentFromRow(row: DriveComponent, beltName: string | undefined): ComponentSpec {
  const c: ComponentSpec = { name: row.name, kind: row.kind };
  if (beltName !== undefined) c.belt = beltName;
  if (row.pulleyMm !== null) c.pulleyMm = row.pulleyMm;
  if (row.outsideMm !== null && row.outsideMm !== undefined) c.outsideMm = row.outsideMm;
  if (row.backside !== null) c.backside = Boolean(row.backside);
  if (row.fixedRatio !== null) c.fixedRatio = row.fixedRatio;
  if (row.overrunning !== null) c.overrunning = Boolean(row.overrunning);
  const b: BearingSpec = {};
  if (row.designation !== null) b.designation = row.designation;
  if (row.balls !== null) b.balls = row.balls;
  if (row.ballMm !== null) b.ballMm = row.ballMm;
  if (row.pitchMm !== null) b.pitchMm = row.pitchMm;
  if (row.contactDeg !== null) b.contactDeg = row.contactDeg;
  if (row.ftf !== null && row.bpfo !== null && row.bpfi !== null && row.bsf !== null) {
    b.factors = { ftf: row.ftf, bpfo: row.bpfo, bpfi: row.bpfi, bsf: row.bsf };
  }
  if (row.rotatingRing !== null) b.rotatingRing = row.rotatingRing;
  if (row.bearingSource) b.source = row.bearingSource;
  if (Object.keys(b).length > 0) c.bearing = b;
  return c;
}

/**
 * Reads an engine's drive document (belts and components in their stored order). The engine's
 * notes ride along as `notes` when non-empty. Pass the transaction the engine row was read in:
 * one transaction sees one snapshot, so a concurrent write never shows half-done (STYLE.md §5).
 */
export async function loadDriveDocument(engine: Engine, transaction: Transaction): Promise<DriveDocument & { notes?: string }> {
  const belts = await Belt.findAll({ where: { engineId: engine.id }, order: [['position', 'ASC']], transaction });
  const components = await DriveComponent.findAll({ where: { engineId: engine.id }, order: [['position', 'ASC']], transaction });
  const beltById = new Map(belts.map((b) => [b.id, b]));
  const componentById = new Map(components.map((c) => [c.id, c]));
  const doc: DriveDocument & { notes?: string } = {
    name: engine.name,
    cylinders: engine.cylinders,
    firingOrder: firingOrderFromText(engine.firingOrder),
    ...(engine.idleRpm !== null ? { idleRpm: engine.idleRpm } : {}),
    belts: belts.map((b) => ({
      name: b.name,
      lengthMm: b.lengthMm,
      driver: (b.driverComponentId !== null && componentById.get(b.driverComponentId)?.name) || '',
      driverPulleyMm: b.driverPulleyMm,
    })),
    components: components.map((c) => componentFromRow(c, c.beltId !== null ? beltById.get(c.beltId)?.name : undefined)),
  };
  if (engine.notes) doc.notes = engine.notes;
  return doc;
}

/** Deletes an engine's belts and components (not the engine), e.g. before rewriting them. */
export async function clearDrive(engineId: number, transaction: Transaction): Promise<void> {
  await Belt.update({ driverComponentId: null }, { where: { engineId }, transaction });
  await DriveComponent.destroy({ where: { engineId }, transaction });
  await Belt.destroy({ where: { engineId }, transaction });
}

/**
 * Replaces an engine's belts and components with those of a validated document. Call inside a
 * transaction; names are matched case-insensitively, as the drive schema compares them.
 */
export async function writeDrive(engine: Engine, doc: DriveDocument, transaction: Transaction): Promise<void> {
  await clearDrive(engine.id, transaction);
  const shopId = engine.shopId;
  const belts = await Belt.bulkCreate(
    doc.belts.map((b, position) => ({
      shopId, engineId: engine.id, position, name: b.name.trim(), nameKey: key(b.name),
      lengthMm: b.lengthMm, driverComponentId: null, driverPulleyMm: b.driverPulleyMm,
    })),
    { transaction },
  );
  const beltIdByKey = new Map(belts.map((b) => [b.nameKey, b.id]));
  const components = await DriveComponent.bulkCreate(
    doc.components.map((c, position) => ({
      shopId, engineId: engine.id, position, name: c.name.trim(), nameKey: key(c.name), kind: c.kind,
      beltId: c.belt !== undefined ? beltIdByKey.get(key(c.belt)) ?? null : null,
      pulleyMm: c.pulleyMm ?? null, outsideMm: c.outsideMm ?? null, bearingSource: c.bearing?.source ?? null, backside: c.backside ?? null, fixedRatio: c.fixedRatio ?? null,
      overrunning: c.overrunning ?? null, designation: opt(c.bearing?.designation)?.trim() ?? null,
      balls: c.bearing?.balls ?? null, ballMm: c.bearing?.ballMm ?? null, pitchMm: c.bearing?.pitchMm ?? null,
      contactDeg: c.bearing?.contactDeg ?? null, ftf: c.bearing?.factors?.ftf ?? null, bpfo: c.bearing?.factors?.bpfo ?? null,
      bpfi: c.bearing?.factors?.bpfi ?? null, bsf: c.bearing?.factors?.bsf ?? null, rotatingRing: c.bearing?.rotatingRing ?? null,
    })),
    { transaction },
  );
  const componentIdByKey = new Map(components.map((c) => [c.nameKey, c.id]));
  for (const [i, b] of doc.belts.entries()) {
    const driverId = componentIdByKey.get(key(b.driver));
    if (driverId !== undefined) await belts[i].update({ driverComponentId: driverId }, { transaction });
  }
}
