import { z } from 'zod';

/**
 * Ratio calibration of an engine's parts (issue 20 item 3): what the Drive library shows and the
 * lead's accept / withdraw request. Percentages: 100·(effective / nominal ratio − 1), negative =
 * the part turns slower than its nominal ratio.
 */
export const CalibrationDecisionSchema = z.object({
  component: z.string().trim().min(1, { message: 'Name the part' }).max(100, { message: 'part name: use at most 100 characters' }),
  accept: z.boolean(),
});
export type CalibrationDecision = z.infer<typeof CalibrationDecisionSchema>;

/** One part's measured correction and, when a lead accepted one, what is in use. */
export interface CalibrationPartDto {
  component: string;
  /** From the current fit; null when no capture measured the part yet. */
  measured: { correctionPct: number; scatterPct: number; standardErrorPct: number; captures: number; cases: number; offered: boolean; sentence: string } | null;
  accepted: { correctionPct: number; scatterPct: number; captures: number; cases: number; acceptedAt: string } | null;
}

/** GET /api/engines/:id/calibration. */
export interface CalibrationDto {
  engineId: number;
  minCaptures: number;
  parts: CalibrationPartDto[];
}

/** One confirmed earlier case alike the current one (issue 20 item 4; GET /api/cases/:id/similar). */
export interface SimilarCaseDto {
  caseId: number;
  roNumber: string;
  vehicleLabel: string;
  engine: { id: number; name: string };
  sameEngine: boolean;
  /** Normalised signature distance 0…1 (0 = same pattern). */
  distance: number;
  confirmed: { component: string; fault: string };
  /** The lead's note on the confirmed cause, or the part and fault. */
  cause: string;
}

export interface SimilarCasesDto { items: SimilarCaseDto[] }
