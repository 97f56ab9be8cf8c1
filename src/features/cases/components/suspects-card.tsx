import { useState } from 'react';
import type { FindingDto } from '../../../../shared/schemas/analyses';
import type { CaseDto } from '../../../../shared/schemas/cases';
import { separationAdvice } from '../../../../shared/ranking/indistinguishable';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../../components/ui/card';
import { Input } from '../../../components/ui/input';
import { Label } from '../../../components/ui/label';
import { EmptyState } from '../../../components/ui/states';
import { cn } from '../../../lib/cn';
import { apiFieldErrors } from '../../../lib/api-field-errors';
import { useCaseMove, useConfirmCause, useFindingDecision } from '../api/use-case-mutations';
import { FAULT_LABELS, when } from '../lib/case-words';
import { NoteDialog } from './note-dialog';

type Decision = { kind: 'dismiss' | 'restore' | 'confirm'; finding: FindingDto } | { kind: 'other' } | null;

/**
 * The ranked suspects: score (the largest text), evidence in short sentences, "cannot be told
 * apart from …" with what would separate them; specialists dismiss or restore with a note; the
 * lead confirms one cause — a suspect or a part not in the list — with a note; re-rank.
 */
export function SuspectsCard({ c, role }: { c: CaseDto; role: string }) {
  const [decision, setDecision] = useState<Decision>(null);
  const [otherPart, setOtherPart] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [showAll, setShowAll] = useState(false);
  const decide = useFindingDecision(c.id);
  const confirm = useConfirmCause(c.id);
  const move = useCaseMove(c.id);
  const specialist = role === 'specialist' || role === 'lead' || role === 'admin';
  const lead = role === 'lead' || role === 'admin';
  const decidable = c.status === 'ranked' || c.status === 'confirmed';
  const all = c.findings.filter((f) => f.inRanking || f.status !== 'suggested');
  // The top six and every decided one; the long tail of weak patterns on request.
  const SHOWN = 6;
  const findings = showAll ? all : all.filter((f, i) => i < SHOWN || f.status !== 'suggested');
  const close = () => { setDecision(null); setError(null); setOtherPart(''); };
  const submit = async (note: string) => {
    if (!decision) return;
    try {
      if (decision.kind === 'confirm') await confirm.mutateAsync({ findingId: decision.finding.id, note });
      else if (decision.kind === 'other') {
        if (!otherPart.trim()) { setError('Name the part you found.'); return; }
        await confirm.mutateAsync({ component: otherPart.trim(), note });
      } else await decide.mutateAsync({ findingId: decision.finding.id, decision: decision.kind, note });
      close();
    } catch (e) {
      setError(apiFieldErrors(e).message ?? Object.values(apiFieldErrors(e).fields)[0] ?? 'Not saved.');
    }
  };
  return (
    <Card>
      <CardHeader className="flex-row flex-wrap items-start justify-between gap-3">
        <div>
          <CardTitle>Suspects</CardTitle>
          <CardDescription>Ranked from the captures' lines against the engine's drive table. Score 0–1.</CardDescription>
        </div>
        <div className="flex gap-2">
          {specialist && decidable ? <Button variant="outline" size="sm" pending={move.isPending && move.variables?.move === 'rerank'} onClick={() => move.mutate({ move: 'rerank' })}>Re-rank with the current engine</Button> : null}
          {lead && c.status === 'ranked' ? <Button variant="outline" size="sm" onClick={() => setDecision({ kind: 'other' })}>Confirm a part not listed</Button> : null}
        </div>
      </CardHeader>
      <CardContent>
        {findings.length === 0 ? (
          <EmptyState title="No suspects yet">
            {c.status === 'open' || c.status === 'testing' ? 'Upload the captures, wait for them to be analysed, then press “Captures complete” to rank.' : 'The ranking found no part whose lines stand out.'}
          </EmptyState>
        ) : (
          <ol className="grid gap-3" aria-label="Suspects">
            {findings.map((f) => (
              <li key={f.id} data-testid={`suspect-${f.rank}`}
                className={cn('grid gap-2 rounded-lg border p-4 sm:grid-cols-[5.5rem_1fr_auto]', f.status === 'dismissed' ? 'border-dashed bg-muted/40' : f.status === 'confirmed' ? 'border-success/60 bg-success/5' : 'border-border')}>
                <div className="text-center">
                  <p className="font-mono text-3xl font-bold tabular-nums" aria-label={`score ${f.score.toFixed(2)}`}>{f.score.toFixed(2)}</p>
                  <p className="text-xs text-muted-foreground">score</p>
                </div>
                <div className="min-w-0">
                  <p className="text-lg font-semibold">
                    <span className="mr-2 font-mono text-muted-foreground">#{f.rank < 9999 ? f.rank : '–'}</span>
                    {f.component} <span className="font-normal text-foreground/80">· {FAULT_LABELS[f.fault] ?? f.fault}</span>
                    {f.status === 'dismissed' ? <Badge variant="outline" className="ml-2">dismissed</Badge> : null}
                    {f.status === 'confirmed' ? <Badge variant="success" className="ml-2">confirmed cause</Badge> : null}
                    {f.approximate ? <Badge variant="warning" className="ml-2">approximate bearing</Badge> : null}
                  </p>
                  <p className="mt-1 font-mono text-base tabular-nums">
                    order <strong>{f.order.toFixed(2)}</strong> <span className="text-muted-foreground">(expected {f.nominalOrder.toFixed(2)})</span>
                    {f.slipPct !== null ? <> · slip <strong>{f.slipPct.toFixed(1)} %</strong></> : null}
                  </p>
                  <p className="mt-1 text-sm">{f.evidence}</p>
                  {f.notes.map((n) => <p key={n} className="text-sm text-foreground/80">{n}</p>)}
                  {f.indistinguishableFrom.length > 0 && !/cannot be told/i.test(f.evidence) ? (
                    <p className="mt-1 text-sm text-warning-foreground">{f.component} {separationAdvice(f.indistinguishableFrom)}.</p>
                  ) : null}
                  {f.note ? <p className="mt-1 text-sm text-muted-foreground">{f.decidedBy?.name ?? 'Someone'}{f.decidedAt ? `, ${when(f.decidedAt)}` : ''}: “{f.note}”</p> : null}
                </div>
                <div className="flex flex-wrap content-start gap-2 sm:flex-col">
                  {specialist && decidable && f.status === 'suggested' ? <Button size="sm" variant="outline" onClick={() => setDecision({ kind: 'dismiss', finding: f })}>Dismiss</Button> : null}
                  {specialist && decidable && f.status === 'dismissed' ? <Button size="sm" variant="outline" onClick={() => setDecision({ kind: 'restore', finding: f })}>Restore</Button> : null}
                  {lead && c.status === 'ranked' && f.status === 'suggested' ? <Button size="sm" onClick={() => setDecision({ kind: 'confirm', finding: f })}>Confirm cause</Button> : null}
                </div>
              </li>
            ))}
          </ol>
        )}
        {all.length > findings.length || showAll ? (
          <Button variant="ghost" size="sm" className="mt-3" onClick={() => setShowAll(!showAll)}>
            {showAll ? `Show the top ${SHOWN}` : `Show all ${all.length} suspects`}
          </Button>
        ) : null}
      </CardContent>
      <NoteDialog
        key={decision ? `${decision.kind}-${'finding' in decision ? decision.finding.id : 'other'}` : 'none'}
        open={decision !== null}
        title={!decision ? '' : decision.kind === 'other' ? 'Confirm a part not in the list' : `${decision.kind === 'dismiss' ? 'Dismiss' : decision.kind === 'restore' ? 'Restore' : 'Confirm'} ${decision.finding.component} · ${FAULT_LABELS[decision.finding.fault] ?? decision.finding.fault}`}
        description={decision?.kind === 'confirm' || decision?.kind === 'other' ? 'The confirmed cause goes on the report with your name and the note.' : undefined}
        confirmLabel={decision?.kind === 'dismiss' ? 'Dismiss' : decision?.kind === 'restore' ? 'Restore' : 'Confirm cause'}
        pending={decide.isPending || confirm.isPending}
        error={error}
        onClose={close}
        onSubmit={(note) => void submit(note)}
      >
        {decision?.kind === 'other' ? (
          <div className="grid gap-1.5">
            <Label htmlFor="other-part">Part</Label>
            <Input id="other-part" value={otherPart} onChange={(e) => setOtherPart(e.target.value)} placeholder="e.g. Crankshaft damper" />
          </div>
        ) : null}
      </NoteDialog>
    </Card>
  );
}
