/**
 * Request and response shapes of the Drive library's engine API (/api/engines). An engine is a
 * drive document (shared/schemas/drive.ts validates its body) plus the shop's notes; responses add
 * the id and what the drive kinematics compute from it.
 */
import { z } from 'zod';
import type { ComponentCandidates, DriveDocument, RotatingRing } from '../drive/types';
import type { EngineChange } from '../drive-io/engine-diff';

/** Sort keys of the engines table; a leading minus sorts descending. */
export const ENGINE_SORTS = ['name', '-name', 'updatedAt', '-updatedAt'] as const;

/** Query of GET /api/engines. */
export const EngineListQuerySchema = z.object({
  search: z.string().trim().max(100, { message: 'Use at most 100 characters' }).default(''),
  sort: z.enum(ENGINE_SORTS, { message: `sort must be one of ${ENGINE_SORTS.join(', ')}` }).default('name'),
  page: z.coerce.number().int().min(1, { message: 'page starts at 1' }).default(1),
  pageSize: z.coerce.number().int().min(1).max(100, { message: 'pageSize must be 1–100' }).default(20),
});
/** Parsed list query. */
export type EngineListQuery = z.infer<typeof EngineListQuerySchema>;

/** Notes the shop keeps beside an engine (not part of the drive document). */
export const EngineNotesSchema = z.string().trim().max(2000, { message: 'Use at most 2000 characters' });

/** One row of the engines table. */
export interface EngineSummaryDto {
  id: number;
  name: string;
  cylinders: number;
  firingOrder: number[];
  idleRpm: number | null;
  belts: number;
  components: number;
  updatedAt: string;
}

/** GET /api/engines. */
export interface EngineListResponse {
  items: EngineSummaryDto[];
  total: number;
  page: number;
  pageSize: number;
}

/** What the kinematics give for one component: its ratio and its defect orders (crank orders). */
export interface ComponentKinematicsDto {
  component: string;
  /** Part speed / crank speed (a magnitude). */
  ratio: number;
  /** Turns opposite to the crank (an odd number of backside pulleys on its chain). */
  backwards: boolean;
  /** Belt speed of its belt at the engine's idle (m/s); null without a belt or idle rpm. */
  beltSpeedMs: number | null;
  /** Belt-pass order of its belt; null without a belt. */
  beltPassOrder: number | null;
  /** Defect orders = ratio × factor; null without a bearing. 2×BSF is the ball-fault order. */
  orders: { shaft: number; ftf: number | null; bpfo: number | null; bpfi: number | null; ball: number | null };
  /** Factors came from the rule of thumb (unknown bearing). */
  approximate: boolean;
  rotatingRing: RotatingRing;
  /** How the bearing factors were obtained. */
  basis: 'factors' | 'geometry' | 'designation' | 'rule-of-thumb' | 'none';
}

/** One belt's speed at idle and its pass order. */
export interface BeltKinematicsDto {
  belt: string;
  speedMs: number | null;
  passOrder: number;
}

/** Everything computed from an engine's drive. */
export interface EngineComputedDto {
  idleRpm: number | null;
  components: ComponentKinematicsDto[];
  belts: BeltKinematicsDto[];
  /** Candidate lines per part and belt (shared/drive/candidate-lines.ts). */
  candidates: ComponentCandidates[];
}

/** GET /api/engines/:id → { engine }. */
export type EngineDetailDto = DriveDocument & {
  id: number;
  notes: string;
  /** Raised by every save; send it back with a write (409 `stale_write` when the engine moved on). */
  version: number;
  updatedAt: string;
  computed: EngineComputedDto;
};

/** One problem of a rejected CSV import (400 `validation_failed` details). */
export interface CsvImportProblemDto {
  line: number;
  field?: string;
  message: string;
}

/** POST /api/engines/:id/import.csv?preview=1 → { preview }: what the import would change. */
export interface CsvImportPreviewDto {
  /** The engine's version the preview was made against (send it with the import). */
  version: number;
  /** Data rows read (belts and parts). */
  rows: number;
  /** The file held the whole engine (engine fields and belts too), not only the parts. */
  wholeEngine: boolean;
  changes: EngineChange[];
  parts: { added: number; changed: number; removed: number };
  belts: { added: number; changed: number; removed: number };
}

/** One save of an engine in its edit history. */
export interface EngineRevisionDto {
  version: number;
  userName: string;
  action: 'create' | 'update' | 'import' | 'duplicate';
  at: string;
  changes: EngineChange[];
}
