import { useState } from 'react';
import type { CaseDto } from '../../../../shared/schemas/cases';
import { compareRepair, VERIFY_DROP_DB } from '../../../../shared/report/repair-verification';
import { Button } from '../../../components/ui/button';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../../components/ui/card';
import { Caution } from '../../../components/ui/states';
import { Table, TableBody, TableCell, TableHead, TableHeader, TableRow } from '../../../components/ui/table';
import { useCaseMove } from '../api/use-case-mutations';
import { NoteDialog } from './note-dialog';

/**
 * Repair verification: the confirmed part's lines after the repair against before (dB per line).
 * A drop of at least 6 dB at the main line, or the line gone, lets the lead verify; a smaller drop
 * needs a note. Then the case can be closed.
 */
export function RepairCard({ c, role }: { c: CaseDto; role: string }) {
  const move = useCaseMove(c.id);
  const [asking, setAsking] = useState<'verify' | 'close' | null>(null);
  const lead = role === 'lead' || role === 'admin';
  const finding = c.confirmed?.findingId ? c.findings.find((f) => f.id === c.confirmed!.findingId) ?? null : null;
  if (!c.confirmed) return null;
  const verdict = finding ? compareRepair(finding) : null;
  return (
    <Card>
      <CardHeader>
        <CardTitle>Repair verification</CardTitle>
        <CardDescription>
          After the repair, record again at the same probe point. A drop of at least {VERIFY_DROP_DB} dB at the part's main line (or the line gone) verifies the repair.
        </CardDescription>
      </CardHeader>
      <CardContent className="grid gap-4">
        {verdict && verdict.lines.length > 0 && verdict.hasAfter ? (
          <Table aria-label="Before and after">
            <TableHeader>
              <TableRow>
                <TableHead className="text-foreground/75">Line</TableHead>
                <TableHead className="text-right text-foreground/75">Order</TableHead>
                <TableHead className="text-right text-foreground/75">Before (over floor)</TableHead>
                <TableHead className="text-right text-foreground/75">After (over floor)</TableHead>
                <TableHead className="text-right text-foreground/75">Change</TableHead>
              </TableRow>
            </TableHeader>
            <TableBody>
              {verdict.lines.map((l) => (
                <TableRow key={l.label}>
                  <TableCell className={l.main ? 'font-semibold' : ''}>{l.label.replace(/(\d)x/g, '$1×')}{l.main ? ' (main)' : ''}</TableCell>
                  <TableCell className="text-right font-mono tabular-nums">{l.nominalOrder.toFixed(2)}</TableCell>
                  <TableCell className="text-right font-mono tabular-nums">{l.beforeSnrDb.toFixed(0)} dB</TableCell>
                  <TableCell className="text-right font-mono tabular-nums">{l.afterSnrDb === null ? 'gone' : `${l.afterSnrDb.toFixed(0)} dB`}</TableCell>
                  <TableCell className="text-right font-mono text-lg font-semibold tabular-nums">{l.changeDb === null ? (l.afterAmplitude === null ? 'gone' : '—') : `${l.changeDb > 0 ? '+' : ''}${l.changeDb.toFixed(1)} dB`}</TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        ) : null}
        {verdict ? (
          verdict.passes ? <p className="text-lg font-semibold text-success" data-testid="repair-verdict">{verdict.sentence}</p>
            : <Caution title={verdict.hasAfter ? 'Smaller drop than expected' : 'No after-repair capture yet'}><span data-testid="repair-verdict">{verdict.sentence}</span></Caution>
        ) : <p className="text-sm text-muted-foreground">The confirmed part is not one of the ranked suspects, so there are no lines to compare; verify with a note.</p>}
        {lead ? (
          <div className="flex gap-2">
            {c.status === 'confirmed' ? <Button onClick={() => (verdict?.passes ? move.mutate({ move: 'verify' }) : setAsking('verify'))} pending={move.isPending} disabled={!verdict?.hasAfter && !!finding}>Mark verified</Button> : null}
            {c.status === 'verified' ? <Button onClick={() => move.mutate({ move: 'close' })} pending={move.isPending}>Close case</Button> : null}
          </div>
        ) : null}
      </CardContent>
      <NoteDialog open={asking === 'verify'} title="Verify with a note" description="The drop is smaller than 6 dB. Say why the repair is still good (e.g. the customer confirms the noise is gone)."
        confirmLabel="Mark verified" pending={move.isPending} onClose={() => setAsking(null)}
        onSubmit={(note) => move.mutate({ move: 'verify', note }, { onSuccess: () => setAsking(null) })} />
    </Card>
  );
}
