import type { QueryClient } from '@tanstack/react-query';
import { useSuspenseQuery } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { meQueryOptions } from '../../features/auth/api/auth-queries';
import { invitesQueryOptions, usersQueryOptions } from '../../features/team/api/team-queries';
import { InviteForm } from '../../features/team/components/invite-form';
import { PendingInvites } from '../../features/team/components/pending-invites';
import { UsersTable } from '../../features/team/components/users-table';
import { requireSection } from '../route-guards';

/** Admins only; warms the users and invites. */
export const teamLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireSection(queryClient, request, 'team');
    await Promise.all([queryClient.ensureQueryData(usersQueryOptions()), queryClient.ensureQueryData(invitesQueryOptions())]);
    return null;
  };

/** Team: the shop's users, their roles, and invites. */
export function TeamRoute() {
  const { data } = useSuspenseQuery(meQueryOptions());
  return (
    <>
      <PageHeader title="Team" description="Who can sign in to your shop, and what each person may do." />
      <div className="flex flex-col gap-6">
        <Card>
          <CardHeader>
            <CardTitle>Users</CardTitle>
            <CardDescription>
              Technicians record and read captures; specialists rank suspects; leads confirm causes and keep the drive library;
              admins also manage the team.
            </CardDescription>
          </CardHeader>
          <CardContent className="px-0 pb-2">
            <UsersTable currentUserId={data.user.id} />
          </CardContent>
        </Card>
        <Card>
          <CardHeader>
            <CardTitle>Invite someone</CardTitle>
            <CardDescription>They get an e-mail with a one-time link to choose a name and password. The link expires.</CardDescription>
          </CardHeader>
          <CardContent>
            <InviteForm />
          </CardContent>
        </Card>
        <Card>
          <CardHeader>
            <CardTitle>Open invites</CardTitle>
          </CardHeader>
          <CardContent className="px-0 pb-2">
            <PendingInvites />
          </CardContent>
        </Card>
      </div>
    </>
  );
}
