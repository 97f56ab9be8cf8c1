import { cva, type VariantProps } from 'class-variance-authority';
import { cn } from '../../lib/cn';

const spinnerVariants = cva('inline-block animate-spin rounded-full border-2 border-current border-r-transparent', {
  variants: { size: { sm: 'size-3.5', md: 'size-5', lg: 'size-8' } },
  defaultVariants: { size: 'md' },
});

export interface SpinnerProps extends VariantProps<typeof spinnerVariants> {
  className?: string;
  /** Announced to screen readers; omit inside a button that already says what it does. */
  label?: string;
}

/** A small rotating ring. */
export function Spinner({ size, className, label }: SpinnerProps) {
  return (
    <span
      role={label ? 'status' : undefined}
      aria-label={label}
      aria-hidden={label ? undefined : true}
      className={cn(spinnerVariants({ size }), className)}
    />
  );
}

/** A centred spinner with a line of text, for a page or panel that is loading. */
export function LoadingState({ label = 'Loading…', className }: { label?: string; className?: string }) {
  return (
    <div className={cn('flex items-center justify-center gap-3 py-16 text-sm text-muted-foreground', className)}>
      <Spinner label={label} />
      <span>{label}</span>
    </div>
  );
}
