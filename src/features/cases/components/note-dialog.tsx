import { useId, useState, type ReactNode } from 'react';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { Label } from '../../../components/ui/label';
import { ErrorState } from '../../../components/ui/states';
import { Textarea } from '../../../components/ui/textarea';

/** A dialog asking for a note before a decision (dismiss, restore, confirm, verify). */
export function NoteDialog({ open, title, description, confirmLabel, required = true, pending, error, onClose, onSubmit, children }: {
  open: boolean; title: string; description?: ReactNode; confirmLabel: string; required?: boolean; pending?: boolean; error?: string | null;
  onClose: () => void; onSubmit: (note: string) => void; children?: ReactNode;
}) {
  const id = useId();
  const [note, setNote] = useState('');
  const [missing, setMissing] = useState(false);
  const submit = () => {
    if (required && note.trim() === '') {
      setMissing(true);
      return;
    }
    onSubmit(note.trim());
  };
  return (
    <Dialog open={open} onClose={onClose} title={title} description={description}
      footer={<><Button variant="outline" onClick={onClose}>Cancel</Button><Button onClick={submit} pending={pending}>{confirmLabel}</Button></>}>
      <div className="grid gap-3">
        {children}
        <div className="grid gap-1.5">
          <Label htmlFor={id}>{required ? 'Note (why)' : 'Note (optional)'}</Label>
          <Textarea id={id} rows={3} value={note} aria-invalid={missing || undefined} onChange={(e) => { setNote(e.target.value); setMissing(false); }} />
          {missing ? <p className="text-xs font-medium text-destructive">Add a note saying why.</p> : null}
        </div>
        {error ? <ErrorState title="Not saved">{error}</ErrorState> : null}
      </div>
    </Dialog>
  );
}
