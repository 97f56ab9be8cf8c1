import { useMemo, useState } from 'react';
import type { Peak } from '../../../../shared/analysis/types';
import type { ComponentCandidates } from '../../../../shared/drive/types';
import { linesOf, strongestUnexplained } from '../../../../shared/plots/candidates';
import { ordersCsvRows, ordersOption } from '../../../../shared/plots/orders-option';
import type { SpectrumData } from '../../../../shared/plots/spectrum-data';
import { Caution } from '../../../components/ui/states';
import { PlotCard } from '../../../components/charts/plot-card';
import { Segmented } from '../../../components/charts/segmented';

export interface OrdersPlotProps {
  orders: SpectrumData & { peaks?: readonly Peak[] };
  envelope?: (SpectrumData & { peaks?: readonly Peak[]; bandHz?: [number, number] }) | null;
  candidates: readonly ComponentCandidates[];
  cylinders: number;
  unit: string;
  focus?: string | null;
  fileName: string;
  title?: string;
  height?: number;
}

/**
 * Orders: the order spectrum over the envelope spectrum on one order axis, the engine's candidate
 * lines as markers with slip-window bands, engine orders shaded, linear or dB, zoom, hover naming
 * the nearest candidate; and the call-out when the strongest line fits no part of the engine.
 */
export function OrdersPlot({ orders, envelope, candidates, cylinders, unit, focus, fileName, title = 'Orders', height = 520 }: OrdersPlotProps) {
  const [scale, setScale] = useState<'linear' | 'db'>('linear');
  const option = useMemo(
    () => ordersOption({ orders, envelope, candidates, cylinders, unit, scale, focus }),
    [orders, envelope, candidates, cylinders, unit, scale, focus],
  );
  const unexplained = useMemo(() => {
    const o = strongestUnexplained(orders.peaks ?? [], linesOf(candidates, 'orders'), orders.resolution);
    if (o) return o;
    return envelope ? strongestUnexplained(envelope.peaks ?? [], linesOf(candidates, 'envelope'), envelope.resolution) : null;
  }, [orders, envelope, candidates]);
  return (
    <PlotCard
      title={title}
      description="Amplitude against order (multiples of crank speed). Coloured markers are where each part can show, bands its slip window; shaded grey bands are engine orders, amber ones the firing orders (likely the engine's own vibration). Hover for the nearest part."
      option={option}
      height={height}
      fileName={fileName}
      csv={() => ordersCsvRows({ orders, envelope })}
      controls={<Segmented label="Amplitude scale" value={scale} onChange={setScale} options={[{ value: 'linear', label: 'Linear' }, { value: 'db', label: 'dB' }]} />}
      footer={
        unexplained ? (
          <Caution title="A strong line fits no part">
            <span data-testid="unexplained-line">{unexplained.message}</span>
          </Caution>
        ) : (
          <p className="text-muted-foreground">Every strong line lies on an engine order or in a part's window.</p>
        )
      }
    />
  );
}
