import type { ReactNode } from 'react';
import { cn } from '../../lib/cn';

/** A page's title, one line saying what the page is for, and its main actions. */
export function PageHeader({ title, description, actions, className }: { title: string; description?: ReactNode; actions?: ReactNode; className?: string }) {
  return (
    <div className={cn('mb-6 flex flex-wrap items-end justify-between gap-4', className)}>
      {/* React 19 hoists <title> into the document head: the tab says which page this is. */}
      <title>{`${title} · Crankwise`}</title>
      <div>
        <h1 className="text-2xl font-semibold tracking-tight">{title}</h1>
        {description ? <p className="mt-1 max-w-prose text-sm text-muted-foreground">{description}</p> : null}
      </div>
      {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
    </div>
  );
}
