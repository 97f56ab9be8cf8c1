/**
 * What changed between two versions of an engine, in rows a person reads: the engine's own fields,
 * then belts and parts matched by name (case-insensitively) as added, removed, or changed field by
 * field (before → after, as the CSV writes the values). Used by the CSV import preview and by the
 * edit history of every save.
 */
import type { DriveDocument } from '../drive/types';
import { cleanNumber } from '../drive/measured-diameter';
import { COMPONENT_CSV_HEADERS, componentToCsvRow } from './component-table';
import { BELT_CSV_HEADERS } from './engine-csv';

/** One field's change. */
export interface FieldChange { field: string; before: string; after: string }

/** One change of an engine: its own fields, or a belt or part added, removed or changed. */
export type EngineChange =
  | { target: 'engine'; change: 'changed'; fields: FieldChange[] }
  | { target: 'belt' | 'part'; name: string; change: 'added' | 'removed' }
  | { target: 'belt' | 'part'; name: string; change: 'changed'; fields: FieldChange[] };

type Doc = DriveDocument & { notes?: string };
const num = (v: number | undefined): string => (v === undefined ? '' : String(cleanNumber(v)));

function fieldChanges(headers: readonly string[], before: string[], after: string[]): FieldChange[] {
  const out: FieldChange[] = [];
  headers.forEach((h, i) => { if ((before[i] ?? '') !== (after[i] ?? '')) out.push({ field: h, before: before[i] ?? '', after: after[i] ?? '' }); });
  return out;
}

function diffRows<T extends { name: string }>(target: 'belt' | 'part', before: readonly T[], after: readonly T[], headers: readonly string[], cells: (r: T) => string[]): EngineChange[] {
  const key = (r: T) => r.name.trim().toLowerCase();
  const old = new Map(before.map((r) => [key(r), r]));
  const seen = new Set<string>();
  const changes: EngineChange[] = [];
  for (const r of after) {
    const prev = old.get(key(r));
    seen.add(key(r));
    if (!prev) { changes.push({ target, name: r.name, change: 'added' }); continue; }
    const fields = fieldChanges(headers, cells(prev), cells(r));
    if (fields.length) changes.push({ target, name: r.name, change: 'changed', fields });
  }
  for (const r of before) if (!seen.has(key(r))) changes.push({ target, name: r.name, change: 'removed' });
  return changes;
}

/** Every change from `before` to `after` (null before = a new engine: everything added). */
export function diffEngines(before: Doc | null, after: Doc): EngineChange[] {
  const engineCells = (d: Doc) => [d.name, String(d.cylinders), d.firingOrder.join('-'), num(d.idleRpm), d.notes ?? ''];
  const changes: EngineChange[] = [];
  const base: Doc = before ?? { name: '', cylinders: Number.NaN, firingOrder: [], belts: [], components: [] };
  const fields = fieldChanges(['name', 'cylinders', 'firingOrder', 'idleRpm', 'notes'], before ? engineCells(base) : ['', '', '', '', ''], engineCells(after));
  if (fields.length) changes.push({ target: 'engine', change: 'changed', fields });
  changes.push(...diffRows('belt', base.belts, after.belts, BELT_CSV_HEADERS, (b) => [b.name, num(b.lengthMm), b.driver, num(b.driverPulleyMm)]));
  changes.push(...diffRows('part', base.components, after.components, COMPONENT_CSV_HEADERS, componentToCsvRow));
  return changes;
}

/** Counts of parts added, changed and removed (what the import preview leads with). */
export function countChanges(changes: readonly EngineChange[], target: 'belt' | 'part') {
  const of = (c: string) => changes.filter((x) => x.target === target && x.change === c).length;
  return { added: of('added'), changed: of('changed'), removed: of('removed') };
}
