import { z } from 'zod';
import { EmailSchema, PasswordSchema, PersonNameSchema } from './common';

/** A shop's name: 2 to 100 characters after trimming. */
export const ShopNameSchema = z
  .string()
  .trim()
  .min(2, { message: 'Enter the shop name (at least 2 characters)' })
  .max(100, { message: 'Use at most 100 characters' });

/** POST /api/setup: the first real shop and its admin (allowed only while no shop but the demo exists). */
export const SetupSchema = z.object({
  shopName: ShopNameSchema,
  adminName: PersonNameSchema,
  adminEmail: EmailSchema,
  password: PasswordSchema,
});
/** `{ shopName, adminName, adminEmail, password }` */
export type Setup = z.infer<typeof SetupSchema>;

/** GET /api/setup/status → whether the first-run set-up page should be offered. */
export const SetupStatusSchema = z.object({ needsSetup: z.boolean() });
/** `{ needsSetup }` */
export type SetupStatus = z.infer<typeof SetupStatusSchema>;

/** PATCH /api/shop (admin): rename the shop. */
export const UpdateShopSchema = z.object({ name: ShopNameSchema }).strict();
/** `{ name }` */
export type UpdateShop = z.infer<typeof UpdateShopSchema>;
