import type { QueryClient } from '@tanstack/react-query';
import { data, Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { outboxMessageQueryOptions } from '../../features/outbox/api/outbox-queries';
import { MessageView } from '../../features/outbox/components/message-view';
import { paths } from '../paths';

function parseId(raw: string | undefined): number {
  const id = Number(raw);
  if (!Number.isInteger(id) || id <= 0) throw data('There is no message at this address.', { status: 404 });
  return id;
}

/** Warms one message (the Outbox loader already checked the role). */
export const outboxMessageLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    await queryClient.ensureQueryData(outboxMessageQueryOptions(parseId(params.id)));
    return null;
  };

/** /outbox/:id: one message. */
export function OutboxMessageRoute() {
  const id = parseId(useParams().id);
  return (
    <>
      <Link to={paths.outbox} className="block border-b border-border px-5 py-2 text-sm text-primary md:hidden">
        ← All messages
      </Link>
      <MessageView id={id} />
    </>
  );
}
