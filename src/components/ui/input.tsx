import type { ComponentProps } from 'react';
import { cn } from '../../lib/cn';

/** A text input; `aria-invalid` turns the border red. */
export function Input({ className, type = 'text', ...props }: ComponentProps<'input'>) {
  return (
    <input
      type={type}
      className={cn(
        'flex h-9 w-full rounded-md border border-input bg-card px-3 py-1 text-sm text-foreground shadow-xs transition-colors placeholder:text-muted-foreground/70',
        'focus-visible:border-ring focus-visible:outline-2 focus-visible:outline-ring/30 disabled:cursor-not-allowed disabled:opacity-60',
        'aria-invalid:border-destructive aria-invalid:outline-destructive/25 aria-invalid:ring-2 aria-invalid:ring-destructive/30',
        className,
      )}
      {...props}
    />
  );
}
