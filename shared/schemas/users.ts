import { z } from 'zod';
import { RoleSchema } from '../auth/roles';
import { PersonNameSchema } from './common';

/** The shop a user belongs to, as the API sends it. */
export const ShopSummarySchema = z.object({
  id: z.number().int(),
  name: z.string(),
  isDemo: z.boolean(),
});
/** `{ id, name, isDemo }`. */
export type ShopSummary = z.infer<typeof ShopSummarySchema>;

/** The user DTO every endpoint returns: never a password hash, never a session. */
export const UserDtoSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: RoleSchema,
  active: z.boolean(),
  shop: ShopSummarySchema,
});
/** `{ id, email, name, role, active, shop }`. */
export type UserDto = z.infer<typeof UserDtoSchema>;

/** PATCH /api/users/:id (admin): any of role, active, name; at least one. */
export const UpdateUserSchema = z
  .object({
    role: RoleSchema.optional(),
    active: z.boolean().optional(),
    name: PersonNameSchema.optional(),
  })
  .strict()
  .refine((v) => v.role !== undefined || v.active !== undefined || v.name !== undefined, {
    message: 'Give at least one of role, active or name',
  });
/** The PATCH body. */
export type UpdateUser = z.infer<typeof UpdateUserSchema>;

/** `{ user }` */
export interface UserResponse {
  user: UserDto;
}
