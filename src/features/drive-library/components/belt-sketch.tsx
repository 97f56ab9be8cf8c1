import { useMemo } from 'react';
import type { DriveDocument } from '../../../../shared/drive/types';
import { layoutDrive, type SketchPulley } from '../lib/belt-layout';

const BELT_COLOURS = ['var(--chart-1)', 'var(--chart-2)', 'var(--chart-4)', 'var(--chart-5)', 'var(--chart-3)'];

/** Name and diameter of a pulley, placed outwards from its belt's loop so lines and labels do not meet. */
function PulleyLabel({ p, centre, font }: { p: SketchPulley; centre: { x: number; y: number }; font: number }) {
  const dx = p.x - centre.x;
  const dy = p.y - centre.y;
  const len = Math.hypot(dx, dy) || 1;
  const ux = dx / len;
  const uy = dy / len;
  // Outwards is clear for a backside pulley too: the belt passes on its inner side.
  const gap = p.r + font * 0.8;
  const sx = ux;
  const sy = uy;
  const x = p.x + sx * gap;
  const y = p.y + sy * gap + (sy > 0.3 ? font * 0.8 : sy < -0.3 ? -font * 1.1 : 0);
  const anchor = sx > 0.35 ? 'start' : sx < -0.35 ? 'end' : 'middle';
  return (
    <text x={x} y={y} textAnchor={anchor} fontSize={font} fill="var(--foreground)">
      {p.component}
      {p.backside ? ' (backside)' : ''}
      <tspan x={x} dy={font * 1.1} fontSize={font * 0.85} fill="var(--muted-foreground)" fontFamily="var(--font-mono)">⌀{Math.round(p.r * 2)}</tspan>
    </text>
  );
}

/**
 * A schematic of the drive drawn from the table: pulleys as circles sized by their effective
 * diameter, each belt as tangent lines round its pulleys in its own colour, backside pulleys
 * dashed and marked. Positions are schematic (the table holds no coordinates).
 */
export function BeltSketch({ doc }: { doc: Pick<DriveDocument, 'belts' | 'components'> }) {
  const layout = useMemo(() => layoutDrive(doc), [doc]);
  if (layout.belts.length === 0) {
    return <p className="text-sm text-muted-foreground">Add a belt and its pulleys to see the layout.</p>;
  }
  const { box } = layout;
  const font = Math.max(box.width, box.height) / 36;
  const drawn = new Set<string>();
  return (
    <figure className="grid gap-2">
      <svg role="img" aria-label="Belt layout sketch" viewBox={`${box.x} ${box.y} ${box.width} ${box.height}`} className="h-auto max-h-[420px] w-full">
        {layout.belts.map((belt) => (
          <path key={belt.name} d={belt.path} fill="none" stroke={BELT_COLOURS[belt.index % BELT_COLOURS.length]} strokeWidth={font * 0.45}
            strokeLinejoin="round" data-belt={belt.name} />
        ))}
        {layout.belts.flatMap((belt) => belt.pulleys.map((p) => {
          const id = `${belt.name}:${p.component}`;
          const first = !drawn.has(p.component.toLowerCase());
          drawn.add(p.component.toLowerCase());
          return (
            <g key={id} data-pulley={p.component} data-backside={p.backside || undefined}>
              <circle cx={p.x} cy={p.y} r={p.r} fill="var(--card)" stroke="var(--foreground)" strokeWidth={font * 0.12}
                strokeDasharray={p.backside ? `${font * 0.5} ${font * 0.3}` : undefined} />
              <circle cx={p.x} cy={p.y} r={Math.min(p.r * 0.18, font * 0.5)} fill="var(--muted-foreground)" />
              {first ? <PulleyLabel p={p} centre={belt.centre} font={font} /> : null}
            </g>
          );
        }))}
      </svg>
      <figcaption className="flex flex-wrap items-center gap-x-4 gap-y-1 text-xs text-muted-foreground">
        {layout.belts.map((b) => (
          <span key={b.name} className="inline-flex items-center gap-1.5">
            <span className="inline-block h-1 w-5 rounded" style={{ background: BELT_COLOURS[b.index % BELT_COLOURS.length] }} />
            {b.name}
          </span>
        ))}
        <span>dashed = backside (turns against the crank)</span>
        {layout.unbelted.length > 0 ? <span>not on a belt: {layout.unbelted.join(', ')}</span> : null}
        <span>Schematic: positions are not to scale.</span>
      </figcaption>
    </figure>
  );
}
