import { ADMIN_ONLY } from '../../shared/auth/access';
import { UpdateShopSchema } from '../../shared/schemas/setup';
import { ShopSettingsSchema } from '../../shared/schemas/shop-settings';
import { getShopSettings, saveShopSettings } from '../services/shop-settings';
import { validate } from '../middleware/validate';
import { Shop } from '../models';
import { notFound } from '../errors';
import type { RouteRow } from './route-row';

const present = (shop: Shop) => ({ id: shop.id, name: shop.name, isDemo: shop.isDemo });

/** The signed-in user's own shop (Shop setup screen). */
export const shopRoutes: RouteRow[] = [
  {
    method: 'get',
    path: '/shop',
    roles: 'signed-in',
    summary: "the user's shop",
    handlers: [(req, res) => void res.json({ shop: present(req.user!.shop) })],
  },
  {
    method: 'patch',
    path: '/shop',
    roles: ADMIN_ONLY,
    summary: 'rename the shop',
    handlers: [
      validate({ body: UpdateShopSchema }),
      async (req, res) => {
        const shop = await Shop.findByPk(req.user!.shopId);
        if (!shop) throw notFound('Shop');
        shop.name = req.body.name;
        await shop.save();
        res.json({ shop: present(shop) });
      },
    ],
  },
  {
    method: 'get',
    path: '/shop/settings',
    roles: 'signed-in',
    summary: "the shop's settings (report header, defaults, diameter offsets, units)",
    handlers: [async (req, res) => void res.json({ settings: await getShopSettings(req.user!.shopId) })],
  },
  {
    method: 'put',
    path: '/shop/settings',
    roles: ADMIN_ONLY,
    summary: "save the shop's settings (Shop setup)",
    handlers: [
      validate({ body: ShopSettingsSchema }),
      async (req, res) => void res.json({ settings: await saveShopSettings(req.user!.shopId, req.body) }),
    ],
  },
];
