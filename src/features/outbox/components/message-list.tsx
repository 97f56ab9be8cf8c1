import { useSuspenseQuery } from '@tanstack/react-query';
import { NavLink } from 'react-router-dom';
import { EmptyState } from '../../../components/ui/states';
import { cn } from '../../../lib/cn';
import { outboxListQueryOptions } from '../api/outbox-queries';

const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** The received messages; each row links to the message (the route decides the URL). */
export function MessageList({ hrefFor }: { hrefFor: (id: number) => string }) {
  const { data } = useSuspenseQuery(outboxListQueryOptions());
  if (data.items.length === 0) {
    return (
      <EmptyState title="No messages yet">
        Invites and password-reset e-mails land here while Crankwise runs its local mail fake (no MAIL_URL set).
      </EmptyState>
    );
  }
  return (
    <ul className="divide-y divide-border" aria-label="Messages">
      {data.items.map((item) => (
        <li key={item.id}>
          <NavLink
            to={hrefFor(item.id)}
            className={({ isActive }) =>
              cn(
                'block px-4 py-3 text-sm transition-colors hover:bg-muted/60 focus-visible:outline-2 focus-visible:-outline-offset-2 focus-visible:outline-ring',
                isActive && 'bg-accent text-accent-foreground hover:bg-accent',
              )
            }
          >
            <span className="block truncate font-medium">{item.subject || '(no subject)'}</span>
            <span className="mt-0.5 flex justify-between gap-3 text-xs text-muted-foreground">
              <span className="truncate">To {item.to}</span>
              <time dateTime={item.createdAt} className="shrink-0 font-mono tabular-nums">
                {dateTime.format(new Date(item.createdAt))}
              </time>
            </span>
          </NavLink>
        </li>
      ))}
    </ul>
  );
}
