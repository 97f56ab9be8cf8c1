import type { EChartsOption, EChartsType } from 'echarts';
import { lazy, Suspense, useRef, type ReactNode } from 'react';
import { PLOT_COLORS } from '../../../shared/plots/palette';
import { fileSlug, toCsv } from '../../../shared/plots/csv';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { ErrorBoundary } from '../ui/error-boundary';
import { LoadingState } from '../ui/spinner';
import { downloadText, downloadUrl } from '../../lib/download';

// echarts arrives with the first plot on screen, never with the first page.
const EChart = lazy(() => import('./echart'));

export interface PlotCardProps {
  /** Heading, also the accessible name of the plot and the base of download names. */
  title: string;
  /** Short line under the title: what the plot shows and how to read it. */
  description?: ReactNode;
  option: EChartsOption;
  height?: number;
  /** Rows for "Download data (CSV)". */
  csv: () => { headers: string[]; rows: (number | string | null)[][] };
  /** Controls beside the download buttons (scale switch, band choice). */
  controls?: ReactNode;
  /** Text under the plot (call-outs, statistics). */
  footer?: ReactNode;
  /** Name parts for downloads, e.g. the RO number and capture name. */
  fileName: string;
  onReady?: (chart: EChartsType) => void;
  onEvents?: Record<string, (params: unknown) => void>;
}

/**
 * A plot on the dark surface with its title, its controls, "Save PNG" and "Download data (CSV)",
 * its own error boundary (a failing chart never takes the page down) and a loading state while
 * echarts loads.
 */
export function PlotCard({ title, description, option, height = 420, csv, controls, footer, fileName, onReady, onEvents }: PlotCardProps) {
  const chart = useRef<EChartsType | null>(null);
  const base = fileSlug(`${fileName} ${title}`);
  const savePng = () => {
    const url = chart.current?.getDataURL({ type: 'png', pixelRatio: 2, backgroundColor: PLOT_COLORS.surface });
    if (url) downloadUrl(url, `${base}.png`);
  };
  const saveCsv = () => {
    const { headers, rows } = csv();
    downloadText(toCsv(headers, rows), `${base}.csv`);
  };
  return (
    <Card className="overflow-hidden">
      <div className="flex flex-wrap items-start justify-between gap-3 px-5 pt-4 pb-3">
        <div className="min-w-0">
          <h2 className="text-base font-semibold tracking-tight">{title}</h2>
          {description ? <p className="mt-0.5 max-w-prose text-sm text-muted-foreground">{description}</p> : null}
        </div>
        <div className="flex flex-wrap items-center gap-2">
          {controls}
          <Button variant="outline" size="sm" onClick={savePng} aria-label={`Save ${title} as PNG`}>
            Save PNG
          </Button>
          <Button variant="outline" size="sm" onClick={saveCsv} aria-label={`Download ${title} data as CSV`}>
            Download CSV
          </Button>
        </div>
      </div>
      <div className="bg-plot">
        <ErrorBoundary title={`The ${title.toLowerCase()} could not be drawn`}>
          <Suspense fallback={<div className="text-plot-foreground" style={{ height }}><LoadingState label="Loading the plot…" /></div>}>
            <EChart
              option={option}
              height={height}
              label={title}
              onEvents={onEvents}
              onReady={(c) => {
                chart.current = c;
                onReady?.(c);
              }}
            />
          </Suspense>
        </ErrorBoundary>
      </div>
      {footer ? <div className="border-t border-border px-5 py-3 text-sm">{footer}</div> : null}
    </Card>
  );
}
