/**
 * The settings of one analysis run, resolved in one order (issue 15 item 2): built-in defaults →
 * engine (cylinders, firing order) → shop defaults → capture (its metadata: channel roles and
 * scales, reference) → this run (a re-analysis's settings). Later tiers win; the engine tier only
 * fills what no later tier gave (shared/analysis/resolve-settings.ts). The resolved
 * AnalysisSettings are stored with each Analysis.
 */
import { resolveSettings } from '../../shared/analysis/resolve-settings';
import type { DriveDocument } from '../../shared/drive/types';
import type { AnalysisSettings, AnalysisSettingsInput } from '../../shared/schemas/analysis-settings';
import { captureSettings, type CaptureMetadata } from '../../shared/schemas/captures';
import { ShopAnalysisDefaultsSchema } from '../../shared/schemas/shop-settings';
import { Shop } from '../models/shop';

/** Loads a shop's default analysis settings (the shop tier). */
export type ShopDefaultsLoader = (shopId: number) => Promise<AnalysisSettingsInput>;

/** The shop tier from Shop setup's analysis defaults (envelope band, samples per revolution, revolutions per block). */
const fromShopSetup: ShopDefaultsLoader = async (shopId) => {
  const shop = await Shop.findByPk(shopId, { attributes: ['id', 'analysisDefaults'] });
  if (!shop?.analysisDefaults) return {};
  try {
    const parsed = ShopAnalysisDefaultsSchema.safeParse(JSON.parse(shop.analysisDefaults));
    return parsed.success ? parsed.data : {};
  } catch {
    return {};
  }
};

let shopDefaultsLoader: ShopDefaultsLoader = fromShopSetup;

/** Replaces where shop defaults come from (tests). */
export function setShopDefaultsLoader(loader: ShopDefaultsLoader): void {
  shopDefaultsLoader = loader;
}

/** The shop tier for `shopId`. */
export function shopDefaults(shopId: number): Promise<AnalysisSettingsInput> {
  return shopDefaultsLoader(shopId);
}

/** Merges the tiers (shop → capture → run) and resolves against the engine; throws a ZodError naming a bad field. */
export function resolveRunSettings(drive: DriveDocument | null, shop: AnalysisSettingsInput, metadata: CaptureMetadata, run: AnalysisSettingsInput): { input: AnalysisSettingsInput; settings: AnalysisSettings } {
  const input: AnalysisSettingsInput = { ...shop, ...captureSettings(metadata), ...run };
  return { input, settings: resolveSettings(input, drive) };
}
