import type { ReactNode } from 'react';
import { Label } from './label';

/** A label, any control and its message (error in red, or a hint), wired by id for screen readers. */
export function FormRow({ id, label, error, hint, children, className }: {
  id: string; label: string; error?: string; hint?: string; children: ReactNode; className?: string;
}) {
  return (
    <div className={`grid content-start gap-1.5 ${className ?? ''}`}>
      <Label htmlFor={id}>{label}</Label>
      {children}
      {error ? <p id={`${id}-message`} className="text-xs font-medium text-destructive">{error}</p>
        : hint ? <p id={`${id}-message`} className="text-xs text-muted-foreground">{hint}</p> : null}
    </div>
  );
}
