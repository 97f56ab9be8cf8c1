import { useMemo } from 'react';
import { probeOption, type ProbeComparison } from '../../../../shared/plots/probe-option';
import { PlotCard } from '../../../components/charts/plot-card';

/** Probe-point comparison: each suspect's line at every probe point, in one unit or relative to the firing line. */
export function ProbePlot({ data, fileName }: { data: ProbeComparison; fileName: string }) {
  const option = useMemo(() => probeOption(data), [data]);
  return (
    <PlotCard
      title="Probe-point comparison"
      description={data.note}
      option={option}
      height={320}
      fileName={fileName}
      csv={() => ({ headers: ['probe_point', ...data.suspects.map((s) => s.name)], rows: data.probePoints.map((p, i) => [p, ...data.suspects.map((s) => s.values[i] ?? null)]) })}
    />
  );
}
