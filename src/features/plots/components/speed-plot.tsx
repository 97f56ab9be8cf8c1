import type { EChartsType } from 'echarts';
import { useEffect, useMemo, useRef } from 'react';
import { speedCsvRows, speedOption } from '../../../../shared/plots/speed-option';
import { PLOT_COLORS } from '../../../../shared/plots/palette';
import { PlotCard } from '../../../components/charts/plot-card';

export interface SpeedStats {
  meanRpm: number;
  minRpm: number;
  maxRpm: number;
  stabilityPct: number;
  edges: number;
  repairedEdges: number;
}

export interface SpeedPlotProps {
  timeS: ArrayLike<number>;
  rpm: ArrayLike<number>;
  edgesS?: ArrayLike<number> | null;
  stats: SpeedStats | null;
  /** Listen playhead in seconds (null when not playing). */
  playheadS?: number | null;
  fileName: string;
}

function Stat({ label, value, unit }: { label: string; value: string; unit?: string }) {
  return (
    <div>
      <dt className="text-xs font-medium text-muted-foreground">{label}</dt>
      <dd className="font-mono text-xl font-semibold tabular-nums">
        {value}
        {unit ? <span className="ml-1 text-sm font-normal text-muted-foreground">{unit}</span> : null}
      </dd>
    </div>
  );
}

/** Speed: rpm against time with the reference edges, the statistics, and the Listen playhead. */
export function SpeedPlot({ timeS, rpm, edgesS, stats, playheadS = null, fileName }: SpeedPlotProps) {
  const chart = useRef<EChartsType | null>(null);
  // The option does not depend on the playhead: it moves by a small merge, not a redraw.
  const option = useMemo(() => speedOption({ timeS, rpm, edgesS }), [timeS, rpm, edgesS]);
  useEffect(() => {
    chart.current?.setOption({
      series: [{
        name: 'rpm',
        markLine: playheadS === null
          ? { data: [] }
          : { symbol: 'none', silent: true, animation: false, lineStyle: { color: PLOT_COLORS.warning, width: 2 }, label: { show: true, formatter: 'playing', color: PLOT_COLORS.warning, position: 'insideEndTop' }, data: [{ xAxis: playheadS }] },
      }],
    });
  }, [playheadS]);
  return (
    <PlotCard
      title="Speed"
      description="Crank speed against time from the reference edges (drawn as ticks along the bottom where the analysis keeps them). The playhead shows where Listen is."
      option={option}
      height={340}
      fileName={fileName}
      onReady={(c) => {
        chart.current = c;
      }}
      csv={() => speedCsvRows({ timeS, rpm })}
      footer={
        stats ? (
          <dl className="grid grid-cols-3 gap-4 sm:grid-cols-6" data-testid="speed-stats">
            <Stat label="Mean" value={stats.meanRpm.toFixed(0)} unit="rpm" />
            <Stat label="Min" value={stats.minRpm.toFixed(0)} unit="rpm" />
            <Stat label="Max" value={stats.maxRpm.toFixed(0)} unit="rpm" />
            <Stat label="Stability" value={stats.stabilityPct.toFixed(2)} unit="%" />
            <Stat label="Edges" value={String(stats.edges)} />
            <Stat label="Repaired edges" value={String(stats.repairedEdges)} />
          </dl>
        ) : null
      }
    />
  );
}
