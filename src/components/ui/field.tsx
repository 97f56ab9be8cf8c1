import { useId, type ComponentProps } from 'react';
import { Input } from './input';
import { Label } from './label';

export interface FieldProps extends ComponentProps<'input'> {
  label: string;
  /** The message for this field (client check or the server's `details`); shown under the input. */
  error?: string;
  hint?: string;
}

/** Label + input + hint/error, wired with ids so screen readers read the error with the field. */
export function Field({ label, error, hint, id, ...props }: FieldProps) {
  const autoId = useId();
  const inputId = id ?? autoId;
  const messageId = `${inputId}-message`;
  return (
    <div className="grid gap-1.5">
      <Label htmlFor={inputId}>{label}</Label>
      <Input
        id={inputId}
        aria-invalid={error ? true : undefined}
        aria-describedby={error || hint ? messageId : undefined}
        {...props}
      />
      {error ? (
        <p id={messageId} className="text-xs font-medium text-destructive">
          {error}
        </p>
      ) : hint ? (
        <p id={messageId} className="text-xs text-muted-foreground">
          {hint}
        </p>
      ) : null}
    </div>
  );
}
