// Engine → DTO: what leaves the server for the engines table and the engine page.
import type { BearingGeometry } from '../../shared/drive/bearing-table';
import type { DriveDocument } from '../../shared/drive/types';
import type { EngineDetailDto, EngineRevisionDto, EngineSummaryDto } from '../../shared/schemas/engines-api';
import type { EngineRevision } from '../models/engine-revision';
import type { Engine } from '../models/engine';
import { firingOrderFromText } from '../services/engine-drive';
import { computeEngine } from '../../shared/drive-io/engine-kinematics';

/** One row of the engines table. */
export function presentEngineSummary(engine: Engine, belts: number, components: number): EngineSummaryDto {
  return {
    id: engine.id, name: engine.name, cylinders: engine.cylinders, firingOrder: firingOrderFromText(engine.firingOrder),
    idleRpm: engine.idleRpm, belts, components, updatedAt: engine.updatedAt.toISOString(),
  };
}

/** The engine page: the document, the notes, and what the kinematics compute from it. */
export function presentEngine(engine: Engine, doc: DriveDocument & { notes?: string }, shopTable: readonly BearingGeometry[]): EngineDetailDto {
  const { notes: _notes, ...document } = doc;
  void _notes;
  return { id: engine.id, ...document, notes: engine.notes, version: engine.version, updatedAt: engine.updatedAt.toISOString(), computed: computeEngine(document, shopTable) };
}

/** One save of the edit history. */
export function presentRevision(r: EngineRevision): EngineRevisionDto {
  let changes: EngineRevisionDto['changes'] = [];
  try {
    changes = JSON.parse(r.changes) as EngineRevisionDto['changes'];
  } catch {
    changes = [];
  }
  return { version: r.version, userName: r.userName, action: r.action, at: r.createdAt.toISOString(), changes };
}
