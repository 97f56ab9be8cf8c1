import type { QueryClient } from '@tanstack/react-query';
import { Suspense } from 'react';
import { Outlet, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../components/ui/card';
import { PageHeader } from '../../components/ui/page-header';
import { LoadingState } from '../../components/ui/spinner';
import { Caution } from '../../components/ui/states';
import { outboxListQueryOptions } from '../../features/outbox/api/outbox-queries';
import { MessageList } from '../../features/outbox/components/message-list';
import { cn } from '../../lib/cn';
import { paths } from '../paths';
import { requireSection } from '../route-guards';

/** Admins only; warms the message list. */
export const outboxLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireSection(queryClient, request, 'outbox');
    await queryClient.ensureQueryData(outboxListQueryOptions());
    return null;
  };

/** Outbox: what the local mail fake received; the list on the left, the open message on the right. */
export function OutboxRoute() {
  const { id } = useParams();
  return (
    <>
      <PageHeader
        title="Outbox"
        description="E-mails Crankwise sent while no mail server is configured: invites and password resets. Open one to follow its link."
      />
      <Caution title="For trying Crankwise out, not for a shop serving real users" className="mb-4">
        <p>
          These messages never leave this server: nobody receives them, and every admin of the shop can read all of them here,
          including other people’s password-reset links. A shop with real users sets <code>MAIL_URL</code> to its mail server
          (see the README, “Configuration”); then mail is delivered and this page stays empty.
        </p>
      </Caution>
      <Card className="grid overflow-hidden md:grid-cols-[20rem_1fr]">
        <div className={cn('border-border md:border-r', id ? 'hidden md:block' : undefined)}>
          <MessageList hrefFor={paths.outboxMessage} />
        </div>
        <div className={cn('min-w-0', id ? undefined : 'hidden md:block')}>
          <Suspense fallback={<LoadingState label="Opening the message…" />}>
            <Outlet />
          </Suspense>
        </div>
      </Card>
    </>
  );
}

/** No message chosen yet. */
export function OutboxIndexRoute() {
  return <p className="px-5 py-16 text-center text-sm text-muted-foreground">Choose a message to read it.</p>;
}
