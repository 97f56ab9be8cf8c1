import { useMemo } from 'react';
import type { CycleEvent } from '../../../../shared/analysis/types';
import { cycleCsvRows, cycleEventText, cycleOption } from '../../../../shared/plots/cycle-option';
import { Caution } from '../../../components/ui/states';
import { PlotCard } from '../../../components/charts/plot-card';

export interface CyclePlotProps {
  averageDeg: ArrayLike<number>;
  rmsDeg?: ArrayLike<number> | null;
  firingOrder: readonly number[];
  phaseResolved: boolean;
  event: CycleEvent | null;
  unit: string;
  fileName: string;
}

/** Engine cycle: the pickup over 720° from cylinder-1 TDC, slots in firing order, the located event. */
export function CyclePlot(props: CyclePlotProps) {
  const option = useMemo(() => cycleOption(props), [props]);
  const text = cycleEventText(props.event, props.phaseResolved);
  return (
    <PlotCard
      title="Engine cycle"
      description="Synchronous average and short-window RMS of the pickup over one engine cycle. The slot names whose power stroke is under way, not the source of the noise."
      option={option}
      height={400}
      fileName={props.fileName}
      csv={() => cycleCsvRows(props)}
      footer={
        props.phaseResolved || !props.event ? (
          <p className="text-lg font-semibold" data-testid="cycle-event">{text}</p>
        ) : (
          <Caution title="Phase not resolved">
            <span data-testid="cycle-event">{text}</span>
          </Caution>
        )
      }
    />
  );
}
