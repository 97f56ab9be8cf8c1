import { z } from 'zod';
import { RoleSchema } from '../auth/roles';
import { EmailSchema, PasswordSchema, PersonNameSchema } from './common';
import { TokenSchema } from './auth';

/** POST /api/invites (admin): who to invite and with which role. */
export const CreateInviteSchema = z.object({ email: EmailSchema, role: RoleSchema });
/** `{ email, role }` */
export type CreateInvite = z.infer<typeof CreateInviteSchema>;

/** An invite as the Team screen lists it. Dates are ISO strings. */
export const InviteDtoSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  role: RoleSchema,
  expiresAt: z.string(),
  acceptedAt: z.string().nullable(),
  createdAt: z.string(),
});
/** `{ id, email, role, expiresAt, acceptedAt, createdAt }` */
export type InviteDto = z.infer<typeof InviteDtoSchema>;

/** Path params of GET /api/invites/:token/info. */
export const InviteTokenParamsSchema = z.object({ token: TokenSchema });
/** `{ token }` */
export type InviteTokenParams = z.infer<typeof InviteTokenParamsSchema>;

/** GET /api/invites/:token/info (public) → what the accept page shows. */
export const InviteInfoSchema = z.object({ email: z.string(), role: RoleSchema, shopName: z.string() });
/** `{ email, role, shopName }` */
export type InviteInfo = z.infer<typeof InviteInfoSchema>;

/** POST /api/invites/accept: sets the new user's name and password, once. */
export const AcceptInviteSchema = z.object({
  token: TokenSchema,
  name: PersonNameSchema,
  password: PasswordSchema,
});
/** `{ token, name, password }` */
export type AcceptInvite = z.infer<typeof AcceptInviteSchema>;

/** An Outbox list row (GET /api/outbox). */
export const OutboxItemSchema = z.object({
  id: z.number().int(),
  to: z.string(),
  from: z.string(),
  subject: z.string(),
  createdAt: z.string(),
});
/** `{ id, to, from, subject, createdAt }` */
export type OutboxItem = z.infer<typeof OutboxItemSchema>;

/** One Outbox message in full (GET /api/outbox/:id). */
export const OutboxMessageSchema = OutboxItemSchema.extend({
  text: z.string(),
  html: z.string().nullable(),
  /** Attached files (e.g. the report PDF); download each from /api/outbox/:id/attachments/:index. */
  attachments: z.array(z.object({ index: z.number().int(), filename: z.string(), contentType: z.string(), size: z.number().int() })).optional(),
});
/** `{ id, to, from, subject, text, html, createdAt }` */
export type OutboxMessage = z.infer<typeof OutboxMessageSchema>;
