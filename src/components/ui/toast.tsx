import { useSyncExternalStore } from 'react';
import { cva, type VariantProps } from 'class-variance-authority';
import { cn } from '../../lib/cn';

/**
 * A tiny toast store: `toast({ title })` from anywhere (query-client error handler, mutations),
 * `<Toaster />` once in the provider. Toasts leave by themselves after a few seconds.
 */

const toastVariants = cva(
  'pointer-events-auto flex w-full items-start gap-3 rounded-lg border bg-card p-3 pr-2 text-sm shadow-lg',
  {
    variants: {
      variant: {
        default: 'border-border',
        success: 'border-border border-l-4 border-l-success',
        error: 'border-border border-l-4 border-l-destructive',
      },
    },
    defaultVariants: { variant: 'default' },
  },
);

export interface ToastInput extends VariantProps<typeof toastVariants> {
  title: string;
  description?: string;
}

interface ToastItem extends ToastInput {
  id: number;
}

const DISMISS_AFTER_MS = 6000;
let items: ToastItem[] = [];
let nextId = 1;
const listeners = new Set<() => void>();

function emit() {
  for (const listener of listeners) listener();
}

/** Removes one toast (or all when no id is given). */
export function dismissToast(id?: number): void {
  items = id === undefined ? [] : items.filter((t) => t.id !== id);
  emit();
}

/** Shows a toast; an identical title+description already on screen is not repeated. */
export function toast(input: ToastInput): number {
  const same = items.find((t) => t.title === input.title && t.description === input.description);
  if (same) return same.id;
  const id = nextId++;
  items = [...items.slice(-3), { ...input, id }];
  emit();
  if (typeof window !== 'undefined') window.setTimeout(() => dismissToast(id), DISMISS_AFTER_MS);
  return id;
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** Renders the current toasts in the bottom-right corner, announced politely to screen readers. */
export function Toaster() {
  const current = useSyncExternalStore(subscribe, () => items, () => items);
  return (
    <div
      aria-live="polite"
      className="pointer-events-none fixed inset-x-4 bottom-4 z-50 flex flex-col gap-2 sm:left-auto sm:w-96"
    >
      {current.map((t) => (
        <div key={t.id} role="status" className={cn(toastVariants({ variant: t.variant }))}>
          <div className="flex-1">
            <p className="font-medium text-foreground">{t.title}</p>
            {t.description ? <p className="mt-0.5 text-muted-foreground">{t.description}</p> : null}
          </div>
          <button
            type="button"
            onClick={() => dismissToast(t.id)}
            className="rounded px-1.5 text-muted-foreground hover:bg-muted hover:text-foreground focus-visible:outline-2 focus-visible:outline-ring"
            aria-label="Dismiss"
          >
            ×
          </button>
        </div>
      ))}
    </div>
  );
}
