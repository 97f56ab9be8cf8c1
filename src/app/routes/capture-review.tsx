import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { Link, NavLink, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { candidateLines } from '../../../shared/drive/candidate-lines';
import type { ComponentCandidates } from '../../../shared/drive/types';
import type { GridSeriesDto, LineSeriesDto } from '../../../shared/schemas/analyses';
import { Card, CardContent } from '../../components/ui/card';
import { LoadingState } from '../../components/ui/spinner';
import { Caution, EmptyState, ErrorState } from '../../components/ui/states';
import { captureAudioUrl, caseDriveQueryOptions, caseQueryOptions, seriesQueryOptions } from '../../features/cases/api/case-queries';
import { FAULT_LABELS } from '../../features/cases/lib/case-words';
import { summaryView } from '../../features/cases/lib/summary';
import { ListenPanel, type ListenChoice } from '../../features/listen/components/listen-panel';
import { bearingPlan, shaftPlan } from '../../features/listen/lib/listen-plan';
import { CyclePlot } from '../../features/plots/components/cycle-plot';
import { OrdersPlot } from '../../features/plots/components/orders-plot';
import { SpectrogramPlot } from '../../features/plots/components/spectrogram-plot';
import { SpeedPlot } from '../../features/plots/components/speed-plot';
import { cn } from '../../lib/cn';
import { CAPTURE_VIEWS, paths, type CaptureView } from '../paths';

const VIEW_LABELS: Record<CaptureView, string> = { orders: 'Orders', cycle: 'Engine cycle', spectrogram: 'Spectrogram', speed: 'Speed', listen: 'Listen' };

export const captureReviewLoader = (queryClient: QueryClient) => async ({ params }: LoaderFunctionArgs) => {
  await queryClient.ensureQueryData(caseQueryOptions(Number(params.caseId)));
  return null;
};

function useLine(analysisId: number, name: 'orders' | 'envelope' | 'cycle' | 'rpm' | 'edges', enabled = true) {
  return useQuery({ ...seriesQueryOptions<LineSeriesDto>(analysisId, name, { points: name === 'orders' || name === 'envelope' ? 8000 : 4000 }), enabled });
}

function SeriesState({ q, what }: { q: { isPending: boolean; isError: boolean; error: Error | null }; what: string }) {
  if (q.isPending) return <LoadingState label={`Loading the ${what}…`} />;
  if (q.isError) return <ErrorState title={`The ${what} could not be loaded`}>{q.error?.message}</ErrorState>;
  return null;
}

/** Capture review: Orders, Engine cycle, Spectrogram, Speed and Listen for one analysed capture. */
export function CaptureReviewRoute() {
  const params = useParams();
  const caseId = Number(params.caseId);
  const captureId = Number(params.captureId);
  const view = (CAPTURE_VIEWS as readonly string[]).includes(params.view ?? '') ? (params.view as CaptureView) : 'orders';
  const [search] = useSearchParams();
  const { data: c } = useSuspenseQuery(caseQueryOptions(caseId));
  const capture = c.captures.find((x) => x.id === captureId);
  const analysis = capture?.analysis ?? null;
  const done = analysis?.status === 'done';
  const aid = analysis?.id ?? 0;
  const drive = useQuery({ ...caseDriveQueryOptions(c.engine?.id ?? 0), enabled: !!c.engine });
  const sv = summaryView(analysis?.summary);
  const candidates: ComponentCandidates[] = useMemo(() => (drive.data ? candidateLines(drive.data) : []), [drive.data]);
  const suspects = c.findings.filter((f) => f.inRanking && f.status !== 'dismissed');
  const focus = search.get('focus') ?? suspects[0]?.component ?? null;
  const unit = capture?.metadata.channels.find((ch) => ch.role === 'pickup')?.unit ?? 'V';
  const [playhead, setPlayhead] = useState<number | null>(null);

  const orders = useLine(aid, 'orders', done && view === 'orders');
  const envelope = useLine(aid, 'envelope', done && view === 'orders');
  const cycle = useLine(aid, 'cycle', done && view === 'cycle');
  const rpm = useLine(aid, 'rpm', done && (view === 'speed' || view === 'listen'));
  const edges = useQuery({ ...seriesQueryOptions<LineSeriesDto>(aid, 'edges', { points: 8000 }), enabled: done && (view === 'speed' || view === 'listen'), retry: false, meta: { quiet: true } });
  const spectrogram = useQuery({ ...seriesQueryOptions<GridSeriesDto>(aid, 'spectrogram', { points: 50_000 }), enabled: done && view === 'spectrogram' });

  const ordersData = useMemo(() => orders.data ? { order: orders.data.x, amplitude: orders.data.y, resolution: sv.ordersResolution, peaks: sv.orderPeaks } : null, [orders.data, sv.ordersResolution, sv.orderPeaks]);
  const envelopeData = useMemo(() => envelope.data ? { order: envelope.data.x, amplitude: envelope.data.y, resolution: sv.envelopeResolution, peaks: sv.envelopePeaks, bandHz: envelope.data.bandHz } : null, [envelope.data, sv.envelopeResolution, sv.envelopePeaks]);

  const listenChoices: ListenChoice[] = useMemo(() => {
    const out: ListenChoice[] = [];
    for (const f of suspects.slice(0, 6)) {
      const label = `${f.component} · ${FAULT_LABELS[f.fault] ?? f.fault}`;
      try {
        if (f.fault === 'shaft' || f.fault === 'belt') {
          const part = candidates.find((p) => p.component === f.component);
          const base = part?.lines.find((l) => l.harmonic === 1 && l.sideband === 0 && (l.fault === 'shaft' || l.fault === 'belt'))?.nominalOrder ?? f.nominalOrder;
          if (sv.meanRpm) out.push({ key: `f${f.id}`, label: `${label} (boost at its shaft harmonics)`, plan: shaftPlan(base * (1 - (f.slipPct ?? 0) / 100), sv.meanRpm) });
        } else if (sv.envelopeBandHz) {
          out.push({ key: `f${f.id}`, label: `${label} (band-pass in the ringing band)`, plan: bearingPlan(sv.envelopeBandHz) });
        }
      } catch {
        // a suspect whose filter cannot be built (no rpm, band outside the audio) is left out
      }
    }
    return out;
  }, [suspects, candidates, sv.meanRpm, sv.envelopeBandHz]);

  if (!capture) return <ErrorState title="No such capture in this case">Open the case and choose a capture from its list.</ErrorState>;
  const fileName = `${c.roNumber} ${capture.originalName}`;
  const speedPlot = rpm.data ? (
    <SpeedPlot timeS={rpm.data.x} rpm={rpm.data.y} edgesS={edges.data?.x ?? null} stats={sv.speed} playheadS={playhead} fileName={fileName} />
  ) : <SeriesState q={rpm} what="speed" />;
  return (
    <div className="grid gap-5">
      <title>{`${capture.originalName} · ${c.roNumber} · Crankwise`}</title>
      <nav aria-label="Breadcrumb" className="text-sm">
        <Link className="text-primary hover:underline" to={paths.cases}>Cases</Link> <span className="text-muted-foreground">/</span>{' '}
        <Link className="text-primary hover:underline" to={paths.case(c.id)}>{c.roNumber}</Link> <span className="text-muted-foreground">/ {capture.originalName}</span>
      </nav>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold tracking-tight">Capture review</h1>
          <p className="text-foreground/85">{capture.metadata.probePoint.label} · {capture.metadata.phase === 'after_repair' ? 'after repair' : 'before repair'}</p>
        </div>
        {sv.meanRpm ? <p className="font-mono text-3xl font-bold tabular-nums">{sv.meanRpm.toFixed(0)} <span className="text-base font-normal text-muted-foreground">rpm mean</span></p> : null}
      </div>
      <nav aria-label="Views" className="flex gap-1 overflow-x-auto border-b border-border">
        {CAPTURE_VIEWS.map((v) => (
          <NavLink key={v} to={paths.captureReview(c.id, capture.id, v)} replace
            className={({ isActive }) => cn('-mb-px whitespace-nowrap border-b-2 px-4 py-2 text-sm font-medium', isActive || v === view ? 'border-primary text-foreground' : 'border-transparent text-foreground/70 hover:text-foreground')}>
            {VIEW_LABELS[v]}
          </NavLink>
        ))}
      </nav>
      {!analysis ? <EmptyState title="Not analysed">This capture has no analysis yet.</EmptyState>
        : analysis.status === 'failed' ? <ErrorState title="The analysis failed">{analysis.error?.message} Go back to the case to retry.</ErrorState>
          : !done ? <LoadingState label={`Analysing… ${analysis.progress} %`} />
            : view === 'orders' ? (
              <>
                {!c.engine ? <Caution title="No engine chosen">Choose the case's engine to see where each part can show.</Caution> : null}
                {ordersData ? (
                  <OrdersPlot orders={ordersData} envelope={envelopeData} candidates={candidates} cylinders={sv.cylinders ?? drive.data?.cylinders ?? 4} unit={unit} focus={focus} fileName={fileName} />
                ) : <SeriesState q={orders} what="order spectrum" />}
              </>
            ) : view === 'cycle' ? (
              cycle.data ? (
                <CyclePlot averageDeg={cycle.data.y} rmsDeg={cycle.data.y2 ?? null} firingOrder={sv.firingOrder ?? drive.data?.firingOrder ?? [1, 3, 4, 2]}
                  phaseResolved={sv.cycle?.phaseResolved ?? false} event={sv.cycle?.event ?? null} unit={unit} fileName={fileName} />
              ) : <SeriesState q={cycle} what="engine cycle" />
            ) : view === 'spectrogram' ? (
              spectrogram.data ? <SpectrogramPlot data={spectrogram.data} fileName={fileName} /> : <SeriesState q={spectrogram} what="spectrogram" />
            ) : view === 'speed' ? speedPlot : (
              <div className="grid gap-5">
                <ListenPanel audioUrl={captureAudioUrl(capture.id)} choices={listenChoices} onPlayhead={setPlayhead} />
                {speedPlot}
              </div>
            )}
      <Card><CardContent className="pt-4 text-sm text-muted-foreground">
        {capture.sampleRateHz ? <span className="font-mono">{(capture.sampleRateHz / 1000).toFixed(1)} kHz · {capture.durationS?.toFixed(1)} s · {capture.channelCount} channels</span> : null}
        {analysis?.driveName ? <span> · ranked against {analysis.driveName}</span> : null}
      </CardContent></Card>
    </div>
  );
}
