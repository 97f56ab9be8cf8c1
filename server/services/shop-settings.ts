/**
 * Shop setup: read and save a shop's own settings (shared/schemas/shop-settings.ts). The default
 * lead must be an active lead or admin of the same shop, checked inside the writing transaction
 * under a lock on that user's row so that a concurrent deactivation cannot slip past.
 */
import { Op } from 'sequelize';
import { ShopAnalysisDefaultsSchema, type ShopSettings, type ShopSettingsDto } from '../../shared/schemas/shop-settings';
import type { DiameterOffsets } from '../../shared/drive/measured-diameter';
import { AppError, notFound } from '../errors';
import { Shop } from '../models/shop';
import { User } from '../models/user';

function analysisDefaultsOf(shop: Shop) {
  let raw: unknown = {};
  try {
    raw = shop.analysisDefaults ? JSON.parse(shop.analysisDefaults) : {};
  } catch {
    raw = {};
  }
  const parsed = ShopAnalysisDefaultsSchema.safeParse(raw);
  return parsed.success ? parsed.data : ShopAnalysisDefaultsSchema.parse({});
}

/** The measured-diameter offsets of a shop (mm on the diameter). */
export async function shopOffsets(shopId: number): Promise<DiameterOffsets> {
  const shop = await Shop.findByPk(shopId);
  if (!shop) throw notFound('Shop');
  return { groovedOffsetMm: shop.groovedOffsetMm, backsideOffsetMm: shop.backsideOffsetMm };
}

/** The settings of the user's shop, with the leads to choose the default from. */
export async function getShopSettings(shopId: number): Promise<ShopSettingsDto> {
  const shop = await Shop.findByPk(shopId);
  if (!shop) throw notFound('Shop');
  const leads = await User.findAll({ where: { shopId, active: true, role: { [Op.in]: ['lead', 'admin'] } }, order: [['name', 'ASC']] });
  return {
    id: shop.id, isDemo: shop.isDemo, name: shop.name, address: shop.address, phone: shop.phone,
    defaultLeadId: shop.defaultLeadId, serviceAdvisorEmail: shop.serviceAdvisorEmail,
    analysisDefaults: analysisDefaultsOf(shop), groovedOffsetMm: shop.groovedOffsetMm, backsideOffsetMm: shop.backsideOffsetMm,
    pulleyUnit: shop.pulleyUnit, leads: leads.map((u) => ({ id: u.id, name: u.name })),
  };
}

/** Saves every setting at once (the form sends them all). */
export async function saveShopSettings(shopId: number, input: ShopSettings): Promise<ShopSettingsDto> {
  const sequelize = Shop.sequelize!;
  await sequelize.transaction(async (t) => {
    const shop = await Shop.findByPk(shopId, { transaction: t, lock: t.LOCK.UPDATE });
    if (!shop) throw notFound('Shop');
    if (input.defaultLeadId !== null) {
      const lead = await User.findOne({ where: { id: input.defaultLeadId, shopId }, transaction: t, lock: t.LOCK.SHARE });
      if (!lead || !lead.active || !['lead', 'admin'].includes(lead.role)) {
        throw new AppError(400, 'validation_failed', 'The default lead must be an active lead technician or admin of this shop',
          [{ path: 'defaultLeadId', message: 'Choose an active lead technician or admin of this shop' }]);
      }
    }
    shop.set({
      name: input.name, address: input.address, phone: input.phone, defaultLeadId: input.defaultLeadId,
      serviceAdvisorEmail: input.serviceAdvisorEmail, analysisDefaults: JSON.stringify(input.analysisDefaults),
      groovedOffsetMm: input.groovedOffsetMm, backsideOffsetMm: input.backsideOffsetMm, pulleyUnit: input.pulleyUnit,
    });
    await shop.save({ transaction: t });
  });
  return getShopSettings(shopId);
}
