import { useSuspenseQuery } from '@tanstack/react-query';
import { outboxMessageQueryOptions } from '../api/outbox-queries';
import { LinkifiedText } from './linkified-text';

const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'medium' });

/** One message: headers, then the text with its links clickable (a tester follows an invite link from here). */
export function MessageView({ id }: { id: number }) {
  const { data } = useSuspenseQuery(outboxMessageQueryOptions(id));
  const message = data.message;
  return (
    <article aria-labelledby="message-subject">
      <header className="border-b border-border px-5 py-4">
        <h2 id="message-subject" className="text-base font-semibold">
          {message.subject || '(no subject)'}
        </h2>
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm">
          <dt className="text-muted-foreground">From</dt>
          <dd className="break-all">{message.from}</dd>
          <dt className="text-muted-foreground">To</dt>
          <dd className="break-all">{message.to}</dd>
          <dt className="text-muted-foreground">Received</dt>
          <dd className="font-mono text-xs leading-5 tabular-nums">{dateTime.format(new Date(message.createdAt))}</dd>
        </dl>
      </header>
      <div className="whitespace-pre-wrap px-5 py-4 text-sm leading-relaxed">
        {message.text ? <LinkifiedText text={message.text} /> : <span className="text-muted-foreground">This message has no text part.</span>}
      </div>
    </article>
  );
}
