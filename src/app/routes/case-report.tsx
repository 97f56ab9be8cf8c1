import { useQuery, useSuspenseQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { candidateLines } from '../../../shared/drive/candidate-lines';
import type { LineSeriesDto } from '../../../shared/schemas/analyses';
import { reportContent } from '../../../shared/report/report-content';
import { Button } from '../../components/ui/button';
import { Card } from '../../components/ui/card';
import { Caution, ErrorState } from '../../components/ui/states';
import { meQueryOptions } from '../../features/auth/api/auth-queries';
import { caseDriveQueryOptions, caseExportUrl, caseQueryOptions, caseShopQueryOptions, reportPdfUrl, seriesQueryOptions } from '../../features/cases/api/case-queries';
import { useSendReport } from '../../features/cases/api/use-case-mutations';
import { summaryView } from '../../features/cases/lib/summary';
import { OrdersPlot } from '../../features/plots/components/orders-plot';
import { cn } from '../../lib/cn';
import { paths } from '../paths';

/** The report: print-ready page (advisor or customer copy), PDF, send to the service advisor, case export. */
export function CaseReportRoute() {
  const caseId = Number(useParams().caseId);
  const [search] = useSearchParams();
  const copy = search.get('copy') === 'customer' ? 'customer' : 'advisor';
  const { data: c } = useSuspenseQuery(caseQueryOptions(caseId));
  const { data: me } = useSuspenseQuery(meQueryOptions());
  // The header: Shop setup's name, address and phone; the shop name alone until those load (or when unset).
  const settings = useQuery(caseShopQueryOptions());
  const shop = settings.data ?? me.user.shop;
  const r = useMemo(() => reportContent(c, shop, copy), [c, shop, copy]);
  const send = useSendReport(c.id);
  const lead = me.user.role === 'lead' || me.user.role === 'admin';
  const finding = c.confirmed?.findingId ? c.findings.find((f) => f.id === c.confirmed!.findingId) : undefined;
  const best = finding?.captures.filter((x) => x.phase === 'before').sort((a, b) => b.score - a.score)[0];
  const capture = c.captures.find((x) => x.id === best?.captureId);
  const aid = capture?.analysis?.status === 'done' ? capture.analysis.id : 0;
  const drive = useQuery({ ...caseDriveQueryOptions(c.engine?.id ?? 0), enabled: !!c.engine });
  const orders = useQuery({ ...seriesQueryOptions<LineSeriesDto>(aid, 'orders', { points: 6000 }), enabled: copy === 'advisor' && aid > 0 });
  const envelope = useQuery({ ...seriesQueryOptions<LineSeriesDto>(aid, 'envelope', { points: 6000 }), enabled: copy === 'advisor' && aid > 0 });
  const sv = summaryView(capture?.analysis?.summary);
  const candidates = useMemo(() => (drive.data ? candidateLines(drive.data) : []), [drive.data]);
  const tab = (k: 'advisor' | 'customer', label: string) => (
    <Link to={paths.caseReport(c.id, k)} replace className={cn('rounded-md px-3 py-1.5 text-sm font-medium', copy === k ? 'bg-primary text-primary-foreground' : 'border border-input bg-card hover:bg-muted')}>{label}</Link>
  );
  return (
    <div className="grid gap-5">
      <title>{`Report ${c.roNumber} · Crankwise`}</title>
      <div className="flex flex-wrap items-center justify-between gap-3 print:hidden">
        <nav aria-label="Breadcrumb" className="text-sm"><Link className="text-primary hover:underline" to={paths.case(c.id)}>{c.roNumber}</Link> <span className="text-muted-foreground">/ Report</span></nav>
        <div className="flex flex-wrap gap-2">
          {tab('advisor', 'Advisor copy')}{tab('customer', 'Customer copy')}
          <Button variant="outline" onClick={() => window.print()}>Print</Button>
          <a className="inline-flex h-9 items-center rounded-md border border-input bg-card px-4 text-sm font-medium shadow-xs hover:bg-muted" href={reportPdfUrl(c.id, copy)} target="_blank" rel="noreferrer">PDF</a>
          <a className="inline-flex h-9 items-center rounded-md border border-input bg-card px-4 text-sm font-medium shadow-xs hover:bg-muted" href={caseExportUrl(c.id)} download>Export case (zip)</a>
          {lead ? <Button onClick={() => send.mutate({ copy })} pending={send.isPending} disabled={!c.confirmed}>Send to service advisor</Button> : null}
        </div>
      </div>
      {send.isSuccess ? <p role="status" className="font-medium text-success print:hidden">Report sent to {send.data.sentTo}.</p> : null}
      {send.isError ? <ErrorState title="The report was not sent" className="print:hidden">{send.error.message}</ErrorState> : null}
      {!c.confirmed ? <Caution title="No cause confirmed yet" className="print:hidden">The report is complete once the lead confirms the cause.</Caution> : null}
      <Card className="mx-auto w-full max-w-4xl p-8 print:max-w-none print:border-0 print:p-0 print:shadow-none" data-testid="report">
        <header className="border-b border-border pb-4">
          <p className="text-xl font-bold">{r.shop.name}</p>
          {r.shop.lines.map((l) => <p key={l} className="text-sm text-muted-foreground">{l}</p>)}
        </header>
        <h1 className="mt-5 text-2xl font-bold">{r.title}</h1>
        <p className="text-sm text-muted-foreground">Status: {r.status}</p>
        <dl className="mt-4 grid grid-cols-[10rem_1fr] gap-x-4 gap-y-1.5">
          {r.facts.map((f) => <div key={f.label} className="contents"><dt className="text-sm font-medium text-muted-foreground">{f.label}</dt><dd>{f.value}</dd></div>)}
        </dl>
        <section className="mt-6 border-t border-border pt-4">
          <h2 className="text-lg font-semibold">{copy === 'advisor' ? 'Confirmed cause' : 'What we found'}</h2>
          {r.cause ? (
            <>
              <p className="mt-1 text-2xl font-bold" data-testid="report-cause">{r.cause.headline}</p>
              {r.cause.detail.map((d) => <p key={d} className="mt-1">{d}</p>)}
              {r.confirmation ? <p className="mt-2 text-sm text-muted-foreground">{r.confirmation}</p> : null}
            </>
          ) : <p className="text-muted-foreground">No cause has been confirmed yet.</p>}
        </section>
        {copy === 'advisor' && orders.data && r.evidenceCaption ? (
          <section className="mt-6 break-inside-avoid">
            <OrdersPlot title="Evidence" height={420} orders={{ order: orders.data.x, amplitude: orders.data.y, resolution: sv.ordersResolution, peaks: sv.orderPeaks }}
              envelope={envelope.data ? { order: envelope.data.x, amplitude: envelope.data.y, resolution: sv.envelopeResolution, peaks: sv.envelopePeaks, bandHz: envelope.data.bandHz } : null}
              candidates={candidates} cylinders={sv.cylinders ?? 4} unit={capture?.metadata.channels.find((ch) => ch.role === 'pickup')?.unit ?? 'V'} focus={finding?.component} fileName={c.roNumber} />
            <p className="mt-1 text-xs text-muted-foreground">{r.evidenceCaption}</p>
          </section>
        ) : null}
        {r.beforeAfter ? (
          <section className="mt-6 break-inside-avoid">
            <h2 className="text-lg font-semibold">{copy === 'advisor' ? 'Before and after the repair' : 'After the repair'}</h2>
            {r.beforeAfter.rows.length > 0 ? (
              <table className="mt-2 w-full text-sm">
                <thead><tr className="text-left text-foreground/75"><th className="py-1">Line</th><th>Order</th><th>Before</th><th>After</th><th className="text-right">Change</th></tr></thead>
                <tbody>{r.beforeAfter.rows.map((row) => (
                  <tr key={row.line} className="border-t border-border"><td className="py-1">{row.line}</td><td className="font-mono">{row.order}</td><td className="font-mono">{row.before}</td><td className="font-mono">{row.after}</td><td className="text-right font-mono text-base font-semibold">{row.change}</td></tr>
                ))}</tbody>
              </table>
            ) : null}
            <p className="mt-2 font-semibold">{r.beforeAfter.verdict}</p>
          </section>
        ) : null}
        <section className="mt-6 border-t border-border pt-4 break-inside-avoid">
          <h2 className="text-lg font-semibold">Safety</h2>
          <ul className="mt-1 list-disc pl-5 text-sm text-warning-foreground">{r.cautions.map((x) => <li key={x}>{x}</li>)}</ul>
        </section>
        <p className="mt-6 text-xs text-muted-foreground">{r.footer}</p>
      </Card>
    </div>
  );
}
