import type { EChartsOption, EChartsType } from 'echarts';
import ReactEChartsCore from 'echarts-for-react/esm/core';
import { echarts } from './echarts-core';

export interface EChartProps {
  option: EChartsOption;
  height: number;
  /** Receives the chart instance (PNG export, playhead updates). */
  onReady?: (chart: EChartsType) => void;
  /** Accessible name of the plot. */
  label: string;
  /** Events by name, e.g. { datazoom: fn }. */
  onEvents?: Record<string, (params: unknown) => void>;
}

/** One echarts canvas (the lazily loaded module: echarts is only fetched when a plot is shown). */
export default function EChart({ option, height, onReady, label, onEvents }: EChartProps) {
  return (
    <div role="img" aria-label={label} className="w-full">
      <ReactEChartsCore
        echarts={echarts}
        option={option}
        notMerge
        lazyUpdate
        style={{ height, width: '100%' }}
        onChartReady={(chart: EChartsType) => onReady?.(chart)}
        onEvents={onEvents}
        opts={{ renderer: 'canvas' }}
      />
    </div>
  );
}
