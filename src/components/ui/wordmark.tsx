import { cn } from '../../lib/cn';

/**
 * Crankwise's mark: a pulley seen face-on (rim and hub) with one timing tick at the top, the
 * point an order is counted from. Drawn in the channel colours: rim indigo, tick and hub teal.
 */
export function Mark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={cn('size-7', className)} aria-hidden focusable="false">
      <circle cx="16" cy="16" r="11" fill="none" className="stroke-chart-reference" strokeWidth="3.5" />
      <circle cx="16" cy="16" r="6" fill="none" className="stroke-chart-reference/35" strokeWidth="1.5" strokeDasharray="2 2.7" />
      <circle cx="16" cy="16" r="2.6" className="fill-chart-pickup" />
      <path d="M16 2.5v6.5" className="stroke-chart-pickup" strokeWidth="3.5" strokeLinecap="round" />
    </svg>
  );
}

/** The mark and the name, as the sidebar and the sign-in card show them. */
export function Wordmark({ className }: { className?: string }) {
  return (
    <span className={cn('inline-flex items-center gap-2 text-lg font-semibold tracking-tight text-foreground', className)}>
      <Mark />
      <span>
        Crank<span className="text-chart-reference">wise</span>
      </span>
    </span>
  );
}
