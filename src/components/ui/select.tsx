import type { SelectHTMLAttributes } from 'react';
import { cn } from '../../lib/cn';

/** A native select styled like the inputs (keyboard and screen-reader behaviour come free). */
export function Select({ className, children, ...props }: SelectHTMLAttributes<HTMLSelectElement>) {
  return (
    <select
      className={cn(
        'h-9 w-full appearance-none rounded-md border border-input bg-card bg-no-repeat py-1 pl-3 pr-8 text-sm text-foreground shadow-xs',
        "bg-[url(\"data:image/svg+xml,%3Csvg xmlns='http://www.w3.org/2000/svg' viewBox='0 0 16 16' fill='none' stroke='%23707a88' stroke-width='1.6'%3E%3Cpath d='M4 6l4 4 4-4'/%3E%3C/svg%3E\")] bg-[length:1rem] bg-[position:right_0.6rem_center]",
        'focus-visible:border-ring focus-visible:outline-2 focus-visible:outline-ring/30 disabled:cursor-not-allowed disabled:opacity-60',
        'aria-invalid:border-destructive',
        className,
      )}
      {...props}
    >
      {children}
    </select>
  );
}
