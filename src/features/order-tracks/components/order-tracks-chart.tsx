import { useQuery } from '@tanstack/react-query';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../../components/ui/card';
import { LoadingState } from '../../../components/ui/spinner';
import { ApiError } from '../../../lib/api-client';
import type { OrderTracksDto } from '../../../../shared/schemas/order-tracks';
import { orderTracksQueryOptions } from '../api/order-tracks';

const W = 640, H = 240, PAD = { l: 52, r: 12, t: 12, b: 32 };
const COLOURS = ['var(--chart-1)', 'var(--chart-2)', 'var(--chart-3)', 'var(--chart-4)', 'var(--chart-5)', 'var(--chart-reference)'];

/** The tracks as lines of dB (re the largest value) against rpm, each peak's half-power span shaded. */
export function OrderTracksSvg({ data }: { data: OrderTracksDto }) {
  const [lo, hi] = data.rpmRange;
  const all = data.tracks.flatMap((t) => t.amplitude).filter((v) => v > 0);
  const top = Math.max(...all, 1e-12);
  const db = (v: number) => Math.max(-40, 20 * Math.log10(Math.max(v, 1e-12) / top));
  const x = (rpm: number) => PAD.l + ((rpm - lo) / Math.max(1, hi - lo)) * (W - PAD.l - PAD.r);
  const y = (d: number) => PAD.t + (-d / 40) * (H - PAD.t - PAD.b);
  const ticks = [0, 1, 2, 3, 4].map((i) => Math.round((lo + ((hi - lo) * i) / 4) / 10) * 10);
  return (
    <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label="Order tracks against engine speed" className="w-full rounded-md bg-[oklch(0.22_0.02_260)]">
      {[0, -10, -20, -30, -40].map((d) => (
        <g key={d}>
          <line x1={PAD.l} x2={W - PAD.r} y1={y(d)} y2={y(d)} stroke="oklch(0.4 0.02 260)" strokeWidth={0.5} />
          <text x={PAD.l - 6} y={y(d) + 4} textAnchor="end" fontSize={10} fill="oklch(0.8 0.02 260)" fontFamily="var(--font-mono)">{d} dB</text>
        </g>
      ))}
      {ticks.map((r) => <text key={r} x={x(r)} y={H - 10} textAnchor="middle" fontSize={10} fill="oklch(0.8 0.02 260)" fontFamily="var(--font-mono)">{r}</text>)}
      <text x={W - PAD.r} y={H - 10} textAnchor="end" fontSize={10} fill="oklch(0.8 0.02 260)">rpm</text>
      {data.tracks.map((t, i) => t.peak ? (
        <rect key={`p${t.label}`} x={x(t.peak.rangeRpm[0])} width={Math.max(1, x(t.peak.rangeRpm[1]) - x(t.peak.rangeRpm[0]))} y={PAD.t} height={H - PAD.t - PAD.b} fill={COLOURS[i % COLOURS.length]} opacity={0.15} />
      ) : null)}
      {data.tracks.map((t, i) => (
        <polyline key={t.label} fill="none" stroke={COLOURS[i % COLOURS.length]} strokeWidth={1.8}
          points={t.rpm.map((r, k) => `${x(r).toFixed(1)},${y(db(t.amplitude[k])).toFixed(1)}`).join(' ')} />
      ))}
    </svg>
  );
}

/**
 * Order tracks (issue 20 item 5) beside the spectrogram: each suspect's line at its fixed order
 * against rpm over a run-up or run-down, and the speed range where it peaks.
 */
export function OrderTracksCard({ analysisId }: { analysisId: number }) {
  const q = useQuery(orderTracksQueryOptions(analysisId));
  const noSweep = q.error instanceof ApiError && q.error.code === 'no_sweep';
  return (
    <Card aria-labelledby={`tracks-${analysisId}`}>
      <CardHeader>
        <CardTitle id={`tracks-${analysisId}`}>Order tracks</CardTitle>
        <CardDescription>Each suspect’s line at its own order as the engine speed changes; a bracket resonance or a pulley’s critical speed shows as a hump.</CardDescription>
      </CardHeader>
      <CardContent className="space-y-3">
        {q.isPending ? <LoadingState label="Tracking the lines…" /> : null}
        {noSweep ? <p className="text-sm text-muted-foreground">{q.error?.message}</p> : null}
        {q.isError && !noSweep ? <p role="alert" className="text-sm text-destructive">Order tracks could not be read: {q.error.message}</p> : null}
        {q.data ? (
          <>
            <OrderTracksSvg data={q.data} />
            <ul className="space-y-1 text-sm" aria-label="Where each line peaks">
              {q.data.tracks.map((t, i) => (
                <li key={t.label} className="flex items-baseline gap-2">
                  <span aria-hidden className="inline-block size-2.5 shrink-0 rounded-full" style={{ background: COLOURS[i % COLOURS.length] }} />
                  <span>{t.sentence} <span className="font-mono tabular-nums text-muted-foreground">(order {t.order.toFixed(3)})</span></span>
                </li>
              ))}
            </ul>
          </>
        ) : null}
      </CardContent>
    </Card>
  );
}
