/**
 * GET /api/analyses/:id/order-tracks (issue 20 item 5): each suspect's line amplitude at its fixed
 * order against rpm over a speed sweep, and the speed range where it peaks.
 */
export interface OrderTrackDto {
  label: string;
  order: number;
  /** rpm bin centres and the line's amplitude (pickup units) in each. */
  rpm: number[];
  amplitude: number[];
  peak: { rpm: number; amplitude: number; rangeRpm: [number, number]; prominenceDb: number } | null;
  /** e.g. "Alternator shaft peaks at 1925 rpm (1750–2030 rpm), 12 dB over its level elsewhere". */
  sentence: string;
}

export interface OrderTracksDto {
  rpmRange: [number, number];
  tracks: OrderTrackDto[];
}
