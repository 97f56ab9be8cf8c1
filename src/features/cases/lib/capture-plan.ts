/**
 * The capture plan of a case, suggested from its engine's drive (issue 16 item 2): a probe point on
 * or near each suspect part's housing, idle and a held rpm, the A/C clutch on and off when there is
 * a compressor, and a belt-off run (what is left with the belt off is the engine's own). Each item
 * is ticked when a before-repair capture covers it, and carries the metadata an upload starts from.
 */
import type { DriveDocument } from '../../../../shared/drive/types';
import type { CaptureCondition, CaptureDto, ProbePoint } from '../../../../shared/schemas/captures';

/** One plan item. */
export interface PlanItem {
  key: string;
  label: string;
  why: string;
  done: boolean;
  /** What an upload for this item starts with. */
  prefill: { probePoint?: Partial<ProbePoint>; condition?: Partial<CaptureCondition> };
}

const HOUSING: Record<string, string> = {
  alternator: 'front housing', water_pump: 'housing by the pulley', power_steering: 'pump body', ac_compressor: 'front housing by the clutch',
  idler: 'mounting bolt', tensioner: 'arm pivot bolt', fan: 'fan bracket', vacuum_pump: 'pump body', other: 'housing',
};

/** The plan for an engine's drive and the case's captures so far. */
export function capturePlan(drive: DriveDocument | null, captures: readonly Pick<CaptureDto, 'metadata'>[], heldRpm = 2000): PlanItem[] {
  const before = captures.filter((c) => c.metadata.phase === 'before');
  const items: PlanItem[] = [];
  const parts = drive ? drive.components.filter((c) => c.kind !== 'crankshaft') : [];
  for (const p of parts) {
    // "Power steering pump" + "pump body" reads "power steering pump body".
    const where = `${p.name} ${HOUSING[p.kind] ?? 'housing'}`.replace(/\b(\w+) \1\b/i, '$1');
    items.push({
      key: `probe:${p.name}`,
      label: `Probe on the ${where}`,
      why: `Lines that grow as the probe nears the ${p.name} point at it.`,
      done: before.some((c) => (c.metadata.probePoint.component ?? '').toLowerCase() === p.name.toLowerCase()),
      prefill: { probePoint: { label: where, component: p.name } },
    });
  }
  items.push({
    key: 'idle', label: 'Idle', why: 'Most drive noises show at idle, where the engine is quiet.',
    done: before.some((c) => c.metadata.condition.speed === 'idle'), prefill: { condition: { speed: 'idle' } },
  });
  items.push({
    key: 'held', label: `Held at about ${heldRpm} rpm`, why: 'A second speed separates lines that follow the crank from fixed resonances.',
    done: before.some((c) => c.metadata.condition.speed === 'held'), prefill: { condition: { speed: 'held', heldRpm } },
  });
  if (parts.some((p) => p.kind === 'ac_compressor')) {
    items.push({
      key: 'ac-on', label: 'A/C clutch on', why: 'A line that appears only with the clutch engaged points at the compressor.',
      done: before.some((c) => c.metadata.condition.acClutch === 'on'), prefill: { condition: { acClutch: 'on' } },
    });
    items.push({
      key: 'ac-off', label: 'A/C clutch off', why: 'The same run with the clutch released, to compare.',
      done: before.some((c) => c.metadata.condition.acClutch === 'off'), prefill: { condition: { acClutch: 'off' } },
    });
  }
  items.push({
    key: 'belt-off', label: 'Belt off (short run)', why: 'What remains with the belt off comes from the engine, not the drive. Keep it short: the water pump and alternator stop.',
    done: before.some((c) => c.metadata.condition.beltOff), prefill: { condition: { beltOff: true } },
  });
  return items;
}
