import { useQuery, useSuspenseQuery } from '@tanstack/react-query';
import { useId, useMemo, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { candidateLines } from '../../../shared/drive/candidate-lines';
import type { LineSeriesDto } from '../../../shared/schemas/analyses';
import type { CaptureDto } from '../../../shared/schemas/captures';
import { compareLines } from '../../../shared/plots/compare-lines';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../components/ui/card';
import { Label } from '../../components/ui/label';
import { PageHeader } from '../../components/ui/page-header';
import { Select } from '../../components/ui/select';
import { LoadingState } from '../../components/ui/spinner';
import { EmptyState } from '../../components/ui/states';
import { Table, TableBody, TableCell, TableHead, TableHeader, TableRow } from '../../components/ui/table';
import { caseDriveQueryOptions, caseQueryOptions, seriesQueryOptions } from '../../features/cases/api/case-queries';
import { summaryView } from '../../features/cases/lib/summary';
import { OrdersPlot } from '../../features/plots/components/orders-plot';
import { paths } from '../paths';

function describe(c: CaptureDto): string {
  const m = c.metadata;
  const cond = [m.condition.speed === 'held' ? `${m.condition.heldRpm} rpm` : 'idle', m.condition.acClutch !== 'unknown' ? `A/C ${m.condition.acClutch}` : null, m.condition.beltOff ? 'belt off' : null, m.phase === 'after_repair' ? 'after repair' : null]
    .filter(Boolean).join(', ');
  return `${m.probePoint.label} — ${cond} (${c.originalName})`;
}

function Side({ capture, title, drive, roNumber }: { capture: CaptureDto; title: string; drive: ReturnType<typeof candidateLines>; roNumber: string }) {
  const aid = capture.analysis!.id;
  const orders = useQuery(seriesQueryOptions<LineSeriesDto>(aid, 'orders', { points: 6000 }));
  const sv = summaryView(capture.analysis?.summary);
  const unit = capture.metadata.channels.find((ch) => ch.role === 'pickup')?.unit ?? 'V';
  if (!orders.data) return <LoadingState label="Loading the order spectrum…" />;
  return (
    <OrdersPlot title={title} height={380} orders={{ order: orders.data.x, amplitude: orders.data.y, resolution: sv.ordersResolution, peaks: sv.orderPeaks }}
      envelope={null} candidates={drive} cylinders={sv.cylinders ?? 4} unit={unit} fileName={`${roNumber} ${capture.originalName}`} />
  );
}

/** Condition comparison: two captures of one case side by side, with the lines that appear, vanish or change by more than 6 dB. */
export function CaseCompareRoute() {
  const caseId = Number(useParams().caseId);
  const id = useId();
  const { data: c } = useSuspenseQuery(caseQueryOptions(caseId));
  const drive = useQuery({ ...caseDriveQueryOptions(c.engine?.id ?? 0), enabled: !!c.engine });
  const analysed = c.captures.filter((x) => x.analysis?.status === 'done');
  const after = analysed.find((x) => x.metadata.phase === 'after_repair');
  const [aId, setA] = useState<number | null>(analysed[0]?.id ?? null);
  const [bId, setB] = useState<number | null>(after?.id ?? analysed[1]?.id ?? null);
  const A = analysed.find((x) => x.id === aId);
  const B = analysed.find((x) => x.id === bId);
  const candidates = useMemo(() => (drive.data ? candidateLines(drive.data) : []), [drive.data]);
  const diffs = useMemo(() => {
    if (!A || !B) return [];
    const a = summaryView(A.analysis?.summary);
    const b = summaryView(B.analysis?.summary);
    return [...compareLines(a.orderPeaks, b.orderPeaks, 'orders', a.ordersResolution), ...compareLines(a.envelopePeaks, b.envelopePeaks, 'envelope', a.envelopeResolution)];
  }, [A, B]);
  return (
    <div className="grid gap-5">
      <nav aria-label="Breadcrumb" className="text-sm"><Link className="text-primary hover:underline" to={paths.case(c.id)}>{c.roNumber}</Link> <span className="text-muted-foreground">/ Compare</span></nav>
      <PageHeader title="Compare captures" description="Two captures of this case side by side: A/C clutch on against off, belt on against off, before against after the repair." />
      {analysed.length < 2 ? <EmptyState title="Two analysed captures are needed">Upload another capture of this case and wait for its analysis.</EmptyState> : (
        <>
          <div className="grid gap-3 sm:grid-cols-2">
            <div className="grid gap-1.5"><Label htmlFor={`${id}-a`}>Capture A</Label>
              <Select id={`${id}-a`} value={aId ?? ''} onChange={(e) => setA(Number(e.target.value))}>{analysed.map((x) => <option key={x.id} value={x.id}>{describe(x)}</option>)}</Select></div>
            <div className="grid gap-1.5"><Label htmlFor={`${id}-b`}>Capture B</Label>
              <Select id={`${id}-b`} value={bId ?? ''} onChange={(e) => setB(Number(e.target.value))}>{analysed.map((x) => <option key={x.id} value={x.id}>{describe(x)}</option>)}</Select></div>
          </div>
          <Card>
            <CardHeader><CardTitle>What changed from A to B</CardTitle><CardDescription>Lines at least 6 dB over the floor that appear, vanish or change by more than 6 dB.</CardDescription></CardHeader>
            <CardContent>
              {diffs.length === 0 ? <p className="text-sm text-muted-foreground">No line appears, vanishes or changes by more than 6 dB.</p> : (
                <Table aria-label="Line changes">
                  <TableHeader><TableRow>
                    <TableHead className="text-foreground/75">Spectrum</TableHead><TableHead className="text-right text-foreground/75">Order</TableHead>
                    <TableHead className="text-foreground/75">Change</TableHead><TableHead className="text-right text-foreground/75">A (over floor)</TableHead>
                    <TableHead className="text-right text-foreground/75">B (over floor)</TableHead><TableHead className="text-right text-foreground/75">dB</TableHead>
                  </TableRow></TableHeader>
                  <TableBody>
                    {diffs.map((d) => (
                      <TableRow key={`${d.spectrum}-${d.order}-${d.kind}`}>
                        <TableCell>{d.spectrum === 'orders' ? 'order spectrum' : 'envelope'}</TableCell>
                        <TableCell className="text-right font-mono text-lg font-semibold tabular-nums">{d.order.toFixed(2)}</TableCell>
                        <TableCell className="font-medium">{d.kind}</TableCell>
                        <TableCell className="text-right font-mono tabular-nums">{d.snrA === null ? '—' : `${d.snrA.toFixed(0)} dB`}</TableCell>
                        <TableCell className="text-right font-mono tabular-nums">{d.snrB === null ? '—' : `${d.snrB.toFixed(0)} dB`}</TableCell>
                        <TableCell className="text-right font-mono text-lg font-semibold tabular-nums">{d.changeDb === null ? '—' : `${d.changeDb > 0 ? '+' : ''}${d.changeDb.toFixed(1)}`}</TableCell>
                      </TableRow>
                    ))}
                  </TableBody>
                </Table>
              )}
            </CardContent>
          </Card>
          <div className="grid gap-5 xl:grid-cols-2">
            {A ? <Side key={`a${A.id}`} capture={A} title="A · Orders" drive={candidates} roNumber={c.roNumber} /> : null}
            {B ? <Side key={`b${B.id}`} capture={B} title="B · Orders" drive={candidates} roNumber={c.roNumber} /> : null}
          </div>
        </>
      )}
    </div>
  );
}
