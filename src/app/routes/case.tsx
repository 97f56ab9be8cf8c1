import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { Peak } from '../../../shared/analysis/types';
import { probeComparison } from '../../../shared/plots/probe-option';
import { meQueryOptions } from '../../features/auth/api/auth-queries';
import { caseDriveQueryOptions, caseQueryOptions } from '../../features/cases/api/case-queries';
import { CaseHeader } from '../../features/cases/components/case-header';
import { CapturePlanCard } from '../../features/cases/components/capture-plan-card';
import { CapturesCard } from '../../features/cases/components/captures-card';
import { RepairCard } from '../../features/cases/components/repair-card';
import { SuspectsCard } from '../../features/cases/components/suspects-card';
import { TimelineCard } from '../../features/cases/components/timeline-card';
import { UploadPanel } from '../../features/cases/components/upload-panel';
import { capturePlan, type PlanItem } from '../../features/cases/lib/capture-plan';
import { ProbePlot } from '../../features/plots/components/probe-plot';
import { SimilarCasesCard } from '../../features/case-memory/components/similar-cases-card';
import { OrderTracksCard } from '../../features/order-tracks/components/order-tracks-chart';
import { buttonVariants } from '../../components/ui/button';
import { paths } from '../paths';
import { SafetyNote } from './safety-note';

/** Warms the case before the page renders (a missing case lands in the route's error boundary). */
export const caseLoader = (queryClient: QueryClient) => async ({ params }: LoaderFunctionArgs) => {
  await queryClient.ensureQueryData(caseQueryOptions(Number(params.caseId)));
  return null;
};

/** The case page: header and actions, capture plan and upload, captures, suspects, probe comparison, repair verification, timeline. */
export function CaseRoute() {
  const caseId = Number(useParams().caseId);
  const { data: c } = useSuspenseQuery(caseQueryOptions(caseId));
  const { data: me } = useSuspenseQuery(meQueryOptions());
  const drive = useQuery({ ...caseDriveQueryOptions(c.engine?.id ?? 0), enabled: !!c.engine });
  const [prefill, setPrefill] = useState<PlanItem['prefill'] | null>(null);
  const role = me.user.role;
  const plan = useMemo(() => capturePlan(drive.data ?? null, c.captures), [drive.data, c.captures]);
  const canUploadBefore = c.status === 'open' || c.status === 'testing';
  const canUploadAfter = c.status === 'confirmed';
  const probe = useMemo(() => {
    const before = c.captures.filter((x) => x.metadata.phase === 'before' && x.analysis?.status === 'done');
    const suspects = c.findings.filter((f) => f.inRanking && f.status !== 'dismissed').slice(0, 3);
    if (before.length < 2 || suspects.length === 0) return null;
    return probeComparison(suspects, before.map((x) => ({
      captureId: x.id, probePoint: x.metadata.probePoint.label,
      unit: x.metadata.channels.find((ch) => ch.role === 'pickup')?.unit ?? 'V',
      orderPeaks: ((x.analysis?.summary?.orders as { peaks?: Peak[] } | undefined)?.peaks ?? []),
    })));
  }, [c]);
  const components = (drive.data?.components ?? []).filter((p) => p.kind !== 'crankshaft').map((p) => p.name);
  // Issue 20: record in the browser (with the engine's cylinders and idle for the live rpm), and
  // order tracks for captures whose speed swept (≥ 1.2× from slowest to fastest revolution).
  const recordPath = `${paths.caseRecord(c.id)}?cylinders=${drive.data?.cylinders ?? 4}${drive.data?.idleRpm ? `&idle=${drive.data.idleRpm}` : ''}`;
  const swept = c.captures.filter((x) => {
    const sp = x.analysis?.status === 'done' ? (x.analysis.summary?.speed as { minRpm?: number; maxRpm?: number } | undefined) : undefined;
    return !!sp && !!sp.minRpm && !!sp.maxRpm && sp.maxRpm >= 1.2 * sp.minRpm;
  });
  return (
    <div className="grid gap-5">
      <nav aria-label="Breadcrumb" className="text-sm"><Link className="text-primary hover:underline" to={paths.cases}>Cases</Link> <span className="text-muted-foreground">/ {c.roNumber}</span></nav>
      <CaseHeader c={c} role={role} reportPath={paths.caseReport(c.id)} comparePath={paths.caseCompare(c.id)} />
      {c.findings.length > 0 ? <SuspectsCard c={c} role={role} /> : null}
      {c.confirmed ? <RepairCard c={c} role={role} /> : null}
      {canUploadAfter ? <UploadPanel caseId={c.id} shopId={me.user.shop.id} components={components} phase="after_repair" prefill={prefill} /> : null}
      {canUploadBefore ? (
        <div className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
          <CapturePlanCard items={plan} canUpload onUse={(item) => setPrefill({ ...item.prefill })} />
          <div className="grid content-start gap-5">
            <UploadPanel caseId={c.id} shopId={me.user.shop.id} components={components} phase="before" prefill={prefill} />
            <Link className={buttonVariants({ variant: 'outline' })} to={recordPath}>Record in the browser</Link>
            <SafetyNote />
          </div>
        </div>
      ) : null}
      <CapturesCard caseId={c.id} captures={c.captures} reviewPath={(id) => paths.captureReview(c.id, id)} />
      {c.findings.length === 0 ? <SuspectsCard c={c} role={role} /> : null}
      {probe ? <ProbePlot data={probe} fileName={c.roNumber} /> : null}
      {swept.map((x) => (x.analysis ? <OrderTracksCard key={x.id} analysisId={x.analysis.id} /> : null))}
      {c.findings.length > 0 ? <SimilarCasesCard caseId={c.id} caseHref={(id) => paths.case(id)} /> : null}
      <div className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        {canUploadBefore ? null : <CapturePlanCard items={plan} canUpload={false} onUse={() => undefined} />}
        <TimelineCard entries={c.timeline} />
      </div>
    </div>
  );
}
