/**
 * The shop's bearing table (BearingType): list, create, update, delete, and the lookups the
 * drive kinematics use. A designation is matched as the kinematics match it
 * (`normaliseDesignation`: case and seal suffix ignored) and is unique per shop. A row that a
 * component names cannot be deleted or renamed (409 `bearing_in_use`).
 */
import { Op, type Transaction } from 'sequelize';
import { BUILT_IN_BEARINGS, normaliseDesignation, type BearingGeometry } from '../../shared/drive/bearing-table';
import type { BearingTypeInput } from '../../shared/schemas/bearings';
import { AppError, notFound } from '../errors';
import { BearingType } from '../models/bearing-type';
import { DriveComponent } from '../models/drive-component';
import { lockShop } from './shop-lock';

/** The shop's rows as the kinematics' `BearingTable` (searched before the built-in rows). */
export async function shopBearingTable(shopId: number, transaction?: Transaction): Promise<BearingGeometry[]> {
  const rows = await BearingType.findAll({ where: { shopId }, transaction });
  return rows.map((r) => ({
    designation: r.designation, balls: r.balls, ballMm: r.ballMm, pitchMm: r.pitchMm,
    contactDeg: r.contactDeg, source: r.source, note: r.notes,
  }));
}

/** How many of the shop's components name each designation key. */
export async function bearingUsage(shopId: number, transaction?: Transaction): Promise<Map<string, number>> {
  const rows = await DriveComponent.findAll({
    where: { shopId, designation: { [Op.ne]: null } }, attributes: ['designation'], transaction,
  });
  const usage = new Map<string, number>();
  for (const r of rows) {
    const k = normaliseDesignation(r.designation!);
    usage.set(k, (usage.get(k) ?? 0) + 1);
  }
  return usage;
}

/** Every row of the shop's table, by designation. */
export async function listBearings(shopId: number): Promise<{ rows: BearingType[]; usage: Map<string, number> }> {
  const [rows, usage] = await Promise.all([
    BearingType.findAll({ where: { shopId }, order: [['designationKey', 'ASC']] }),
    bearingUsage(shopId),
  ]);
  return { rows, usage };
}

/** One row of the shop's table; 404 for another shop's or a missing row. */
export async function getBearing(shopId: number, id: number, transaction?: Transaction): Promise<BearingType> {
  const row = await BearingType.findOne({ where: { id, shopId }, transaction });
  if (!row) throw notFound('Bearing');
  return row;
}

async function assertDesignationFree(shopId: number, designationKey: string, exceptId: number | null, transaction?: Transaction) {
  const clash = await BearingType.findOne({ where: { shopId, designationKey }, transaction });
  if (clash && clash.id !== exceptId) {
    throw new AppError(409, 'designation_taken', `Designation "${clash.designation}" is already in this shop's table; edit that row instead`,
      [{ path: 'designation', message: `"${clash.designation}" is already in the table` }]);
  }
}

/** Adds a row to the shop's table (under the shop's lock, so two equal designations cannot both pass). */
export async function createBearing(shopId: number, input: BearingTypeInput): Promise<BearingType> {
  const designationKey = normaliseDesignation(input.designation);
  return BearingType.sequelize!.transaction(async (t) => {
    await lockShop(shopId, t);
    await assertDesignationFree(shopId, designationKey, null, t);
    return BearingType.create({ shopId, ...input, designationKey }, { transaction: t });
  });
}

/**
 * Edits a row; renaming a designation that components name is refused (409 `bearing_in_use`).
 * The use is counted under the shop's lock, which every engine write takes too.
 */
export async function updateBearing(shopId: number, id: number, input: BearingTypeInput): Promise<BearingType> {
  return BearingType.sequelize!.transaction(async (t) => {
    await lockShop(shopId, t);
    const row = await getBearing(shopId, id, t);
    const designationKey = normaliseDesignation(input.designation);
    if (designationKey !== row.designationKey) {
      const used = (await bearingUsage(shopId, t)).get(row.designationKey) ?? 0;
      if (used > 0) {
        throw new AppError(409, 'bearing_in_use', `${used} part(s) name "${row.designation}"; change them before renaming it`);
      }
      await assertDesignationFree(shopId, designationKey, row.id, t);
    }
    return row.update({ ...input, designationKey }, { transaction: t });
  });
}

/**
 * Deletes a row, unless a component of the shop's engines names it (409 `bearing_in_use`). The
 * use is counted under the shop's lock, so an engine saved at the same moment either comes first
 * (and the delete is refused) or comes after (and finds the designation gone: a field error).
 */
export async function deleteBearing(shopId: number, id: number): Promise<void> {
  await BearingType.sequelize!.transaction(async (t) => {
    await lockShop(shopId, t);
    const row = await getBearing(shopId, id, t);
    const used = (await bearingUsage(shopId, t)).get(row.designationKey) ?? 0;
    if (used > 0) {
      throw new AppError(409, 'bearing_in_use', `${used} part(s) name "${row.designation}"; give them another bearing before deleting it`);
    }
    await row.destroy({ transaction: t });
  });
}

/**
 * Seeds a shop's table with the published rows of docs/references.md §1 (the built-in rows marked
 * `published`), skipping designations the shop already has. Called when a shop is created
 * (demo shop, set-up page, `npm run create-shop`).
 */
export async function seedPublishedBearings(shopId: number, transaction?: Transaction): Promise<number> {
  const published = BUILT_IN_BEARINGS.filter((b) => b.source === 'published');
  const existing = new Set((await BearingType.findAll({ where: { shopId }, transaction })).map((r) => r.designationKey));
  const rows = published
    .filter((b) => !existing.has(normaliseDesignation(b.designation)))
    .map((b) => ({
      shopId, designation: b.designation, designationKey: normaliseDesignation(b.designation), balls: b.balls,
      ballMm: b.ballMm, pitchMm: b.pitchMm, contactDeg: b.contactDeg, source: b.source, notes: b.note,
    }));
  if (rows.length > 0) await BearingType.bulkCreate(rows, { transaction });
  return rows.length;
}
