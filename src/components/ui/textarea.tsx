import type { TextareaHTMLAttributes } from 'react';
import { cn } from '../../lib/cn';

/** A multi-line text input styled like the inputs. */
export function Textarea({ className, ...props }: TextareaHTMLAttributes<HTMLTextAreaElement>) {
  return (
    <textarea
      className={cn(
        'flex min-h-20 w-full rounded-md border border-input bg-card px-3 py-2 text-sm text-foreground shadow-xs placeholder:text-muted-foreground/70',
        'focus-visible:border-ring focus-visible:outline-2 focus-visible:outline-ring/30 aria-invalid:border-destructive',
        className,
      )}
      {...props}
    />
  );
}
