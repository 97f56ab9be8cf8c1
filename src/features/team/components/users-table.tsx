import { useState } from 'react';
import { useSuspenseQuery } from '@tanstack/react-query';
import { ROLES, ROLE_LABELS, type Role } from '../../../../shared/auth/roles';
import type { UserDto } from '../../../../shared/schemas/users';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { Select } from '../../../components/ui/select';
import { EmptyState } from '../../../components/ui/states';
import { Table, TableBody, TableCell, TableHead, TableHeader, TableRow } from '../../../components/ui/table';
import { toast } from '../../../components/ui/toast';
import { usersQueryOptions } from '../api/team-queries';
import { useUpdateUser } from '../api/use-team-mutations';

/**
 * The shop's users with their role and status. An admin changes a role from the select and
 * deactivates or reactivates a user; their own row is read-only (the server refuses it too).
 */
export function UsersTable({ currentUserId }: { currentUserId: number }) {
  const { data } = useSuspenseQuery(usersQueryOptions());
  const update = useUpdateUser();
  const [confirming, setConfirming] = useState<UserDto | null>(null);

  const pendingFor = (id: number) => (update.isPending && update.variables?.id === id ? update.variables.changes : undefined);

  const changeRole = (user: UserDto, role: Role) => {
    update.mutate(
      { id: user.id, changes: { role } },
      { onSuccess: () => toast({ title: `${user.name} is now ${ROLE_LABELS[role]}`, variant: 'success' }) },
    );
  };

  const setActive = (user: UserDto, active: boolean) => {
    update.mutate(
      { id: user.id, changes: { active } },
      {
        onSuccess: () => toast({ title: active ? `${user.name} can sign in again` : `${user.name} is deactivated`, variant: 'success' }),
        onSettled: () => setConfirming(null),
      },
    );
  };

  if (data.items.length === 0) {
    return (
      <EmptyState title="No users yet" className="mx-5 mb-3">Invite the people of your shop with the form on this page.</EmptyState>
    );
  }
  return (
    <>
      <Table className="min-w-[44rem]">
        <TableHeader>
          <TableRow>
            <TableHead>Name</TableHead>
            <TableHead>E-mail</TableHead>
            <TableHead className="w-56">Role</TableHead>
            <TableHead>Status</TableHead>
            <TableHead className="text-right">
              <span className="sr-only">Actions</span>
            </TableHead>
          </TableRow>
        </TableHeader>
        <TableBody>
          {data.items.map((user) => {
            const self = user.id === currentUserId;
            const pending = pendingFor(user.id);
            return (
              <TableRow key={user.id} className={user.active ? undefined : 'text-muted-foreground'}>
                <TableCell className="font-medium">
                  {user.name} {self ? <Badge variant="outline">you</Badge> : null}
                </TableCell>
                <TableCell>{user.email}</TableCell>
                <TableCell>
                  <Select
                    aria-label={`Role of ${user.name}`}
                    value={pending?.role ?? user.role}
                    disabled={self || pending !== undefined}
                    title={self ? 'You cannot change your own role; another admin can.' : undefined}
                    onChange={(event) => changeRole(user, event.target.value as Role)}
                  >
                    {ROLES.map((role) => (
                      <option key={role} value={role}>
                        {ROLE_LABELS[role]}
                      </option>
                    ))}
                  </Select>
                </TableCell>
                <TableCell>
                  {user.active ? <Badge variant="success">Active</Badge> : <Badge variant="outline">Deactivated</Badge>}
                </TableCell>
                <TableCell className="text-right">
                  {self ? null : user.active ? (
                    <Button variant="ghost" size="sm" className="text-destructive" onClick={() => setConfirming(user)}>
                      Deactivate
                    </Button>
                  ) : (
                    <Button variant="outline" size="sm" pending={pending?.active === true} onClick={() => setActive(user, true)}>
                      Reactivate
                    </Button>
                  )}
                </TableCell>
              </TableRow>
            );
          })}
        </TableBody>
      </Table>
      <Dialog
        open={confirming !== null}
        onClose={() => setConfirming(null)}
        title={`Deactivate ${confirming?.name ?? ''}?`}
        description="They are signed out and can no longer sign in. Their work stays in the shop's cases. You can reactivate them later."
        footer={
          <>
            <Button variant="outline" onClick={() => setConfirming(null)}>
              Cancel
            </Button>
            <Button variant="destructive" pending={update.isPending} onClick={() => confirming && setActive(confirming, false)}>
              Deactivate
            </Button>
          </>
        }
      />
    </>
  );
}
