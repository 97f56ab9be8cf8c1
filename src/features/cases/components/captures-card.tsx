import { Link } from 'react-router-dom';
import type { CaptureDto } from '../../../../shared/schemas/captures';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Card, CardContent, CardHeader, CardTitle } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/states';
import { Table, TableBody, TableCell, TableHead, TableHeader, TableRow } from '../../../components/ui/table';
import { useRetryAnalysis } from '../api/use-case-mutations';
import { ProgressBar } from './progress-bar';

function condition(c: CaptureDto): string {
  const m = c.metadata.condition;
  const parts = [m.speed === 'held' ? `held ${m.heldRpm ?? ''} rpm` : 'idle'];
  if (m.acClutch !== 'unknown') parts.push(`A/C ${m.acClutch}`);
  if (m.beltOff) parts.push('belt off');
  return parts.join(', ');
}

/** The case's captures with their analysis progress, failures (what to do, retry) and a link to review. */
export function CapturesCard({ caseId, captures, reviewPath }: { caseId: number; captures: CaptureDto[]; reviewPath: (captureId: number) => string }) {
  const retry = useRetryAnalysis(caseId);
  return (
    <Card>
      <CardHeader><CardTitle>Captures</CardTitle></CardHeader>
      <CardContent>
        {captures.length === 0 ? (
          <EmptyState title="No captures yet">Follow the capture plan: upload a recording at each probe point.</EmptyState>
        ) : (
          <Table aria-label="Captures">
            <TableHeader>
              <TableRow>
                <TableHead className="text-foreground/75">File</TableHead>
                <TableHead className="text-foreground/75">Probe point</TableHead>
                <TableHead className="text-foreground/75">Condition</TableHead>
                <TableHead className="text-foreground/75">Phase</TableHead>
                <TableHead className="min-w-56 text-foreground/75">Analysis</TableHead>
              </TableRow>
            </TableHeader>
            <TableBody>
              {captures.map((c) => {
                const a = c.analysis;
                const meanRpm = (a?.summary?.speed as { meanRpm?: number } | undefined)?.meanRpm;
                return (
                  <TableRow key={c.id} data-testid={`capture-row-${c.id}`}>
                    <TableCell className="font-mono text-sm">{c.originalName}</TableCell>
                    <TableCell>{c.metadata.probePoint.label}{c.metadata.probePoint.component ? <span className="block text-xs text-muted-foreground">near {c.metadata.probePoint.component}</span> : null}</TableCell>
                    <TableCell className="whitespace-nowrap">{condition(c)}</TableCell>
                    <TableCell>{c.metadata.phase === 'after_repair' ? <Badge variant="success">after repair</Badge> : <Badge variant="outline">before</Badge>}</TableCell>
                    <TableCell>
                      {!a ? <span className="text-muted-foreground">Not queued</span>
                        : a.status === 'done' ? (
                          <div className="flex flex-wrap items-center gap-3">
                            <Badge variant="success">Analysed</Badge>
                            {meanRpm ? <span className="font-mono text-base font-semibold tabular-nums">{meanRpm.toFixed(0)} rpm</span> : null}
                            <Link className="font-medium text-primary hover:underline" to={reviewPath(c.id)}>Review</Link>
                          </div>
                        ) : a.status === 'failed' ? (
                          <div role="alert" className="grid gap-2">
                            <p className="text-sm"><span className="font-semibold text-destructive">Analysis failed.</span> {a.error?.message ?? 'The capture could not be analysed.'}</p>
                            <Button size="sm" variant="outline" className="justify-self-start" pending={retry.isPending && retry.variables === a.id} onClick={() => retry.mutate(a.id)}>Retry</Button>
                          </div>
                        ) : (
                          <ProgressBar label={a.status === 'queued' ? 'Waiting to analyse' : `Analysing (${a.stage})`} value={a.progress} />
                        )}
                    </TableCell>
                  </TableRow>
                );
              })}
            </TableBody>
          </Table>
        )}
      </CardContent>
    </Card>
  );
}
