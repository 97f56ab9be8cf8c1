import { cn } from '../../../lib/cn';

/** A labelled progress bar (role progressbar with its value), in the pickup's teal or amber for a warning. */
export function ProgressBar({ label, value, tone = 'default', className }: { label: string; value: number; tone?: 'default' | 'warning'; className?: string }) {
  const v = Math.max(0, Math.min(100, Math.round(value)));
  return (
    <div className={cn('grid gap-1', className)}>
      <div className="flex justify-between text-xs text-muted-foreground"><span>{label}</span><span className="font-mono tabular-nums">{v} %</span></div>
      <div role="progressbar" aria-label={label} aria-valuenow={v} aria-valuemin={0} aria-valuemax={100} className="h-2 overflow-hidden rounded-full bg-muted">
        <div className={cn('h-full rounded-full transition-[width]', tone === 'warning' ? 'bg-warning' : 'bg-chart-pickup')} style={{ width: `${v}%` }} />
      </div>
    </div>
  );
}
