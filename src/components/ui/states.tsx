import type { ReactNode } from 'react';
import { cn } from '../../lib/cn';

export interface StateProps {
  title: string;
  children?: ReactNode;
  /** An icon or small drawing above the title. */
  icon?: ReactNode;
  /** Buttons or links under the text. */
  action?: ReactNode;
  className?: string;
}

/** "Nothing here yet": says what will appear and, where there is one, how to get it. */
export function EmptyState({ title, children, icon, action, className }: StateProps) {
  return (
    <div className={cn('flex flex-col items-center gap-2 rounded-lg border border-dashed border-border px-6 py-12 text-center', className)}>
      {icon ? <div className="mb-1 text-muted-foreground">{icon}</div> : null}
      <p className="font-medium text-foreground">{title}</p>
      {children ? <div className="max-w-prose text-sm text-muted-foreground">{children}</div> : null}
      {action ? <div className="mt-3 flex gap-2">{action}</div> : null}
    </div>
  );
}

/** A failure the user should read: what went wrong and what to do. */
export function ErrorState({ title, children, action, className }: StateProps) {
  return (
    <div role="alert" className={cn('rounded-lg border border-destructive/30 bg-destructive/5 px-5 py-4 text-sm', className)}>
      <p className="font-medium text-destructive">{title}</p>
      {children ? <div className="mt-1 text-foreground/80">{children}</div> : null}
      {action ? <div className="mt-3 flex gap-2">{action}</div> : null}
    </div>
  );
}

/** A caution in amber: safety notes and warnings that are not errors. */
export function Caution({ title, children, className }: StateProps) {
  return (
    <div role="note" className={cn('rounded-lg border border-warning/60 bg-warning-muted px-4 py-3 text-sm text-warning-foreground', className)}>
      <p className="font-semibold">{title}</p>
      {children ? <div className="mt-1">{children}</div> : null}
    </div>
  );
}
