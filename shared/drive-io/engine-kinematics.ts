/**
 * What the Drive library shows beside each row: ratio, direction, belt speed at idle, belt-pass
 * order and the defect orders (1×, FTF, BPFO, BPFI, 2×BSF as crank orders = ratio × factor), plus
 * the full candidate lines of shared/drive. Bearings resolve as the ranking resolves them: entered
 * factors, geometry, the shop's designation table, then the built-in rows, else the stated rule of
 * thumb (marked approximate). Shared so the engine page can show them live while a row is edited.
 */
import { bearingFactors } from '../drive/bearing-factors';
import type { BearingGeometry } from '../drive/bearing-table';
import { candidateLines } from '../drive/candidate-lines';
import { beltPassOrder, beltSpeedMs, speedRatio, turnsBackwards } from '../drive/kinematics';
import type { DriveDocument } from '../drive/types';
import type { BeltKinematicsDto, ComponentKinematicsDto, EngineComputedDto } from '../schemas/engines-api';

/** Computes the kinematics of a validated drive document against the shop's bearing table. */
export function computeEngine(doc: DriveDocument, shopTable: readonly BearingGeometry[]): EngineComputedDto {
  const idleRpm = doc.idleRpm ?? null;
  const belts: BeltKinematicsDto[] = doc.belts.map((b) => ({
    belt: b.name,
    speedMs: idleRpm !== null ? beltSpeedMs(doc, b.name, idleRpm) : null,
    passOrder: beltPassOrder(doc, b.name),
  }));
  const beltByKey = new Map(belts.map((b) => [b.belt.toLowerCase(), b]));
  const components: ComponentKinematicsDto[] = doc.components.map((c) => {
    const ratio = speedRatio(doc, c.name);
    const belt = c.belt ? beltByKey.get(c.belt.toLowerCase()) : undefined;
    const base = {
      component: c.name, ratio, backwards: turnsBackwards(doc, c.name),
      beltSpeedMs: belt?.speedMs ?? null, beltPassOrder: belt?.passOrder ?? null,
    };
    if (c.kind === 'crankshaft') {
      return { ...base, orders: { shaft: 1, ftf: null, bpfo: null, bpfi: null, ball: null }, approximate: false, rotatingRing: 'inner', basis: 'none' };
    }
    const resolved = bearingFactors(c.bearing, shopTable);
    const f = resolved.factors;
    return {
      ...base,
      orders: { shaft: ratio, ftf: ratio * f.ftf, bpfo: ratio * f.bpfo, bpfi: ratio * f.bpfi, ball: ratio * 2 * f.bsf },
      approximate: resolved.approximate,
      rotatingRing: resolved.rotatingRing,
      basis: resolved.basis,
    };
  });
  return { idleRpm, components, belts, candidates: candidateLines(doc, { shopTable }) };
}
