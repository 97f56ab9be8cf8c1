import type { ComponentProps, ReactNode } from 'react';
import { cn } from '../../../lib/cn';

/** The outline of a field that must be fixed (inputs and selects alike). */
export const invalidCls = 'aria-invalid:border-destructive aria-invalid:bg-destructive/5 aria-invalid:ring-2 aria-invalid:ring-destructive/40';

/** A compact input for a table cell; its message (from the client check or the server) shows under it. */
export function CellInput({ error, numeric, className, ...props }: ComponentProps<'input'> & { error?: string; numeric?: boolean }) {
  return (
    <div className="grid gap-0.5">
      <input
        aria-invalid={error ? true : undefined}
        title={error}
        inputMode={numeric ? 'decimal' : undefined}
        className={cn(
          'h-8 w-full rounded-md border border-input bg-card px-2 text-sm shadow-xs focus-visible:border-ring focus-visible:outline-2 focus-visible:outline-ring/30',
          invalidCls,
          numeric && 'text-right font-mono tabular-nums',
          className,
        )}
        {...props}
      />
      {error ? <span role="status" className="min-w-36 max-w-56 text-[11px] leading-tight text-destructive">{error}</span> : null}
    </div>
  );
}

/** A computed number in the monospace font; a dash when there is none. */
export function Num({ value, digits = 3, approximate }: { value: number | null | undefined; digits?: number; approximate?: boolean }) {
  if (value === null || value === undefined || !Number.isFinite(value)) return <span className="text-muted-foreground">—</span>;
  return (
    <span className={cn('font-mono tabular-nums', approximate && 'text-warning-foreground')} title={approximate ? 'Approximate: bearing unknown, rule of thumb' : undefined}>
      {approximate ? '≈' : ''}
      {value.toFixed(digits)}
    </span>
  );
}

/** A read-only cell value: numbers in monospace, empty as a dash. */
export function Shown({ children, mono }: { children: ReactNode; mono?: boolean }) {
  if (children === '' || children === null || children === undefined) return <span className="text-muted-foreground">—</span>;
  return <span className={cn(mono && 'font-mono tabular-nums')}>{children}</span>;
}
