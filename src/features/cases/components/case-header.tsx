import { Link } from 'react-router-dom';
import type { CaseDto } from '../../../../shared/schemas/cases';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { useCaseMove } from '../api/use-case-mutations';
import { StatusBadge } from './status-badge';

/** The case's header: RO, vehicle, complaint, engine, people, status, and the actions the role may take. */
export function CaseHeader({ c, role, reportPath, comparePath }: { c: CaseDto; role: string; reportPath: string; comparePath: string }) {
  const move = useCaseMove(c.id);
  const lead = role === 'lead' || role === 'admin';
  const fact = (label: string, value: string) => (
    <div><dt className="text-xs font-medium text-muted-foreground">{label}</dt><dd className="font-medium">{value}</dd></div>
  );
  return (
    <Card className="p-5">
      <title>{`${c.roNumber} · Crankwise`}</title>
      <div className="flex flex-wrap items-start justify-between gap-4">
        <div className="min-w-0">
          <div className="flex flex-wrap items-center gap-3">
            <h1 className="font-mono text-2xl font-bold tracking-tight">{c.roNumber}</h1>
            <StatusBadge status={c.status} />
          </div>
          <p className="mt-1 text-lg">{c.vehicleLabel}{c.vehicle.vin ? <span className="ml-2 font-mono text-sm text-muted-foreground">{c.vehicle.vin}</span> : null}</p>
          <p className="mt-1 max-w-prose text-foreground/85">“{c.complaint}”</p>
        </div>
        <div className="flex flex-wrap gap-2">
          {c.status === 'testing' ? (
            <Button onClick={() => move.mutate({ move: 'complete' })} pending={move.isPending && move.variables?.move === 'complete'} disabled={!c.rankable.ok}
              title={c.rankable.reason ?? undefined}>Captures complete</Button>
          ) : null}
          {lead && (c.status === 'ranked' || c.status === 'confirmed') ? (
            <Button variant="outline" onClick={() => move.mutate({ move: 'reopen' })} pending={move.isPending && move.variables?.move === 'reopen'}>Re-open for captures</Button>
          ) : null}
          {c.captures.filter((x) => x.analysis?.status === 'done').length >= 2 ? <Link to={comparePath} className="inline-flex h-9 items-center rounded-md border border-input bg-card px-4 text-sm font-medium shadow-xs hover:bg-muted">Compare captures</Link> : null}
          {c.confirmed ? <Link to={reportPath} className="inline-flex h-9 items-center rounded-md bg-primary px-4 text-sm font-medium text-primary-foreground shadow-sm hover:bg-primary/90">Report</Link> : null}
        </div>
      </div>
      {c.status === 'testing' && !c.rankable.ok && c.rankable.reason ? <p className="mt-2 text-sm text-warning-foreground">To rank: {c.rankable.reason}.</p> : null}
      <dl className="mt-4 grid grid-cols-2 gap-4 border-t border-border pt-4 sm:grid-cols-4">
        {fact('Engine', c.engine?.name ?? 'Not chosen')}
        {fact('Technician', c.technician?.name ?? '—')}
        {fact('Lead', c.lead?.name ?? '—')}
        {fact('Service advisor', c.advisorName || c.advisorEmail || '—')}
      </dl>
    </Card>
  );
}
