import type { InviteDto } from '../../shared/schemas/invites';
import type { Invite } from '../models';

/** Invite → the Team screen's row: never the token hash. */
export function presentInvite(invite: Invite): InviteDto {
  return {
    id: invite.id,
    email: invite.email,
    role: invite.role,
    expiresAt: invite.expiresAt.toISOString(),
    acceptedAt: invite.acceptedAt ? invite.acceptedAt.toISOString() : null,
    createdAt: invite.createdAt.toISOString(),
  };
}
