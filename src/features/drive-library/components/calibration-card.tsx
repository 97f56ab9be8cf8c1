import { useQuery } from '@tanstack/react-query';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../../components/ui/card';
import { LoadingState } from '../../../components/ui/spinner';
import { ApiError } from '../../../lib/api-client';
import { calibrationQueryOptions, useDecideCalibration } from '../api/calibration';

const pct = (v: number) => `${v >= 0 ? '+' : '−'}${Math.abs(v).toFixed(1)} %`;

/**
 * Calibration (issue 20 item 3): each part's effective-ratio correction measured from its shaft
 * lines across the engine's cases, with its case-to-case scatter; a lead accepts it, which
 * narrows that part's windows in later rankings.
 */
export function CalibrationCard({ engineId, canWrite }: { engineId: number; canWrite: boolean }) {
  const q = useQuery(calibrationQueryOptions(engineId));
  const decide = useDecideCalibration(engineId);
  const failure = decide.error instanceof ApiError ? decide.error.message : decide.error ? 'The change was not saved; try again.' : null;
  return (
    <Card aria-labelledby="calibration-title">
      <CardHeader>
        <CardTitle id="calibration-title">Calibration</CardTitle>
        <CardDescription>
          Hand-measured pulley diameters are off by 1–3 % and belts creep. Each part’s real speed, measured from its shaft line over this
          engine’s cases, corrects its ratio; an accepted correction narrows that part’s windows in later rankings.
        </CardDescription>
      </CardHeader>
      <CardContent>
        {q.isPending ? <LoadingState label="Reading the measured shaft lines…" /> : null}
        {q.isError ? <p role="alert" className="text-sm text-destructive">The calibration could not be read: {q.error.message}</p> : null}
        {q.data && q.data.parts.length === 0 ? (
          <p className="text-sm text-muted-foreground">No shaft line of a part was measured yet. Corrections appear once {q.data.minCaptures} captures on two cases of this engine show a part’s own shaft line.</p>
        ) : null}
        {q.data && q.data.parts.length > 0 ? (
          <ul className="divide-y divide-border" aria-label="Ratio corrections">
            {q.data.parts.map((p) => (
              <li key={p.component} className="flex flex-wrap items-center justify-between gap-3 py-3">
                <div className="min-w-0 space-y-1">
                  <p className="flex items-center gap-2 font-medium">
                    {p.component}
                    {p.accepted ? <Badge>in use: {pct(p.accepted.correctionPct)} ± {p.accepted.scatterPct.toFixed(1)} %</Badge> : null}
                  </p>
                  <p className="text-sm text-muted-foreground">{p.measured ? p.measured.sentence : 'no measurement in the current cases'}</p>
                </div>
                {canWrite ? (
                  p.accepted ? (
                    <Button size="sm" variant="outline" pending={decide.isPending && decide.variables?.component === p.component}
                      onClick={() => decide.mutate({ component: p.component, accept: false })}>Withdraw</Button>
                  ) : (
                    <Button size="sm" disabled={!p.measured?.offered} pending={decide.isPending && decide.variables?.component === p.component}
                      onClick={() => decide.mutate({ component: p.component, accept: true })}>Accept {p.measured ? pct(p.measured.correctionPct) : ''}</Button>
                  )
                ) : null}
              </li>
            ))}
          </ul>
        ) : null}
        {failure ? <p role="alert" className="mt-2 text-sm text-destructive">{failure}</p> : null}
      </CardContent>
    </Card>
  );
}
