import { useState } from 'react';
import { useSuspenseQuery } from '@tanstack/react-query';
import { ROLE_LABELS } from '../../../../shared/auth/roles';
import type { InviteDto } from '../../../../shared/schemas/invites';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { EmptyState } from '../../../components/ui/states';
import { Table, TableBody, TableCell, TableHead, TableHeader, TableRow } from '../../../components/ui/table';
import { toast } from '../../../components/ui/toast';
import { invitesQueryOptions } from '../api/team-queries';
import { useRevokeInvite } from '../api/use-team-mutations';

const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** Invites not yet accepted, with their expiry; an admin can revoke one so its link stops working. */
export function PendingInvites({ now = new Date() }: { now?: Date }) {
  const { data } = useSuspenseQuery(invitesQueryOptions());
  const revoke = useRevokeInvite();
  const [confirming, setConfirming] = useState<InviteDto | null>(null);
  const pending = data.items.filter((invite) => invite.acceptedAt === null);

  if (pending.length === 0) {
    return (
      <EmptyState title="No open invites" className="mx-5 mb-3">Invites you send appear here until they are accepted or expire.</EmptyState>
    );
  }
  return (
    <>
      <Table className="min-w-[36rem]">
        <TableHeader>
          <TableRow>
            <TableHead>E-mail</TableHead>
            <TableHead>Role</TableHead>
            <TableHead>Sent</TableHead>
            <TableHead>Expires</TableHead>
            <TableHead className="text-right">
              <span className="sr-only">Actions</span>
            </TableHead>
          </TableRow>
        </TableHeader>
        <TableBody>
          {pending.map((invite) => {
            const expired = new Date(invite.expiresAt) <= now;
            return (
              <TableRow key={invite.id}>
                <TableCell className="font-medium">{invite.email}</TableCell>
                <TableCell>{ROLE_LABELS[invite.role]}</TableCell>
                <TableCell className="font-mono text-xs tabular-nums">{dateTime.format(new Date(invite.createdAt))}</TableCell>
                <TableCell>
                  {expired ? (
                    <Badge variant="warning">Expired</Badge>
                  ) : (
                    <span className="font-mono text-xs tabular-nums">{dateTime.format(new Date(invite.expiresAt))}</span>
                  )}
                </TableCell>
                <TableCell className="text-right">
                  <Button variant="ghost" size="sm" className="text-destructive" onClick={() => setConfirming(invite)}>
                    Revoke
                  </Button>
                </TableCell>
              </TableRow>
            );
          })}
        </TableBody>
      </Table>
      <Dialog
        open={confirming !== null}
        onClose={() => setConfirming(null)}
        title="Revoke this invite?"
        description={
          <>
            The link sent to <span className="font-medium text-foreground">{confirming?.email}</span> stops working. You can invite
            the address again later.
          </>
        }
        footer={
          <>
            <Button variant="outline" onClick={() => setConfirming(null)}>
              Keep it
            </Button>
            <Button
              variant="destructive"
              pending={revoke.isPending}
              onClick={() =>
                confirming &&
                revoke.mutate(confirming.id, {
                  onSuccess: () => toast({ title: `Invite to ${confirming.email} revoked`, variant: 'success' }),
                  onSettled: () => setConfirming(null),
                })
              }
            >
              Revoke invite
            </Button>
          </>
        }
      />
    </>
  );
}
