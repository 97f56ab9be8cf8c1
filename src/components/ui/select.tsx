import type { SelectHTMLAttributes } from 'react';
import { cn } from '../../lib/cn';

/** A native select styled like the inputs (keyboard and screen-reader behaviour come free). */
export function Select({ className, children, ...props }: SelectHTMLAttributes<HTMLSelectElement>) {
  return (
    <span className={cn('relative inline-flex w-full min-w-36', className)}>
      <select
        className={cn(
          'h-9 w-full appearance-none rounded-md border border-input bg-card py-1 pl-3 pr-8 text-sm text-foreground shadow-xs',
          'focus-visible:border-ring focus-visible:outline-2 focus-visible:outline-ring/30 disabled:cursor-not-allowed disabled:bg-muted/60 disabled:text-muted-foreground',
          'aria-invalid:border-destructive',
        )}
        {...props}
      >
        {children}
      </select>
      <svg
        viewBox="0 0 16 16"
        aria-hidden
        className="pointer-events-none absolute right-2.5 top-1/2 size-4 -translate-y-1/2 text-muted-foreground"
        fill="none"
        stroke="currentColor"
        strokeWidth="1.6"
        strokeLinecap="round"
        strokeLinejoin="round"
      >
        <path d="m4 6 4 4 4-4" />
      </svg>
    </span>
  );
}
