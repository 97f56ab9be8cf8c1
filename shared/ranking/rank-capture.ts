/**
 * Ranks the drive's parts for one capture (DESIGN.md "Ranking suspects"). Interim version: the
 * entry point's signature is final; the scoring is being filled in.
 */
import type { RankingEntry, RankingInput } from '../analysis/types';
import type { DriveDocument } from '../drive/types';
import type { BearingTable } from '../drive/bearing-table';

/** Options of `rankCapture`. */
export interface RankOptions {
  /** The shop's bearing table, searched before the built-in rows. */
  shopTable?: BearingTable;
}

/**
 * One entry per (component, fault) and per belt, sorted by score (0–1) descending, ties by name.
 */
export function rankCapture(drive: DriveDocument, input: RankingInput, options: RankOptions = {}): RankingEntry[] {
  void drive; void input; void options;
  return [];
}
