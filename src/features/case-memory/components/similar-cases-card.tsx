import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { Badge } from '../../../components/ui/badge';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../../components/ui/card';
import { LoadingState } from '../../../components/ui/spinner';
import { similarCasesQueryOptions } from '../api/similar-cases';

const FAULT = { shaft: 'shaft', outer_race: 'outer race', inner_race: 'inner race', ball: 'ball', cage: 'cage', belt: 'belt' } as Record<string, string>;

/**
 * Similar cases (issue 20 item 4): confirmed earlier cases of the shop whose order signatures are
 * most alike this case's, same engine first, with their confirmed cause and a link. The case page
 * passes `caseHref` (features never import the app's paths).
 */
export function SimilarCasesCard({ caseId, caseHref }: { caseId: number; caseHref: (id: number) => string }) {
  const q = useQuery(similarCasesQueryOptions(caseId));
  return (
    <Card aria-labelledby={`similar-${caseId}`}>
      <CardHeader>
        <CardTitle id={`similar-${caseId}`}>Similar cases</CardTitle>
        <CardDescription>Confirmed earlier cases whose lines look most like this one’s, same engine first.</CardDescription>
      </CardHeader>
      <CardContent>
        {q.isPending ? <LoadingState label="Comparing with confirmed cases…" /> : null}
        {q.isError ? <p role="alert" className="text-sm text-destructive">Similar cases could not be read: {q.error.message}</p> : null}
        {q.data && q.data.items.length === 0 ? <p className="text-sm text-muted-foreground">No confirmed case of this shop looks alike yet.</p> : null}
        {q.data && q.data.items.length > 0 ? (
          <ol className="divide-y divide-border" aria-label="Similar confirmed cases">
            {q.data.items.map((s) => (
              <li key={s.caseId} className="flex flex-wrap items-baseline justify-between gap-2 py-3">
                <div className="min-w-0 space-y-0.5">
                  <p className="font-medium">
                    <Link className="text-primary hover:underline" to={caseHref(s.caseId)}>{s.roNumber}</Link>{' '}
                    <span className="text-sm text-muted-foreground">{s.vehicleLabel} · {s.engine.name}</span>
                  </p>
                  <p className="text-sm">Confirmed: {s.confirmed.component}, {FAULT[s.confirmed.fault] ?? s.confirmed.fault} — {s.cause}</p>
                </div>
                <span className="flex items-center gap-2">
                  {s.sameEngine ? <Badge>same engine</Badge> : <Badge variant="outline">other engine</Badge>}
                  <span className="font-mono text-lg font-semibold tabular-nums" title="100 × (1 − normalised signature distance)">{Math.round(100 * (1 - s.distance))} % alike</span>
                </span>
              </li>
            ))}
          </ol>
        ) : null}
      </CardContent>
    </Card>
  );
}
