/**
 * The named scenario set the ranking and accuracy tests share: three invented engines
 * (tests/fixtures/drives/) and one planted fault per scenario, covering six fault kinds, parts
 * with near-equal ratios, an outer-ring-turning backside idler, a part on a second belt driven by
 * a driven part, a fixed-ratio (cam-driven) part, a truly indistinguishable pair (same ratio and
 * same bearing), creep up to 3 %, SNR down to −3 dB, with and without an impulsive distractor,
 * and every reference kind. Captures are short (6 s at 24 kHz) so a few seeds each fit `npm test`.
 */
import i4PetrolJson from '../fixtures/drives/fixture-i4-petrol.json';
import v6PetrolJson from '../fixtures/drives/fixture-v6-petrol.json';
import i4DieselJson from '../fixtures/drives/fixture-i4-diesel.json';
import { parseDriveDocument } from '../../shared/schemas/drive';
import type { DriveDocument } from '../../shared/drive/types';
import { generateCapture, type GeneratedCapture } from '../../shared/synth/generate-capture';
import type { GenerateOptionsInput } from '../../shared/synth/options';

/** The three fixture engines, validated through the drive schema. */
export const drives = {
  i4Petrol: parseDriveDocument(i4PetrolJson),
  v6Petrol: parseDriveDocument(v6PetrolJson),
  i4Diesel: parseDriveDocument(i4DieselJson),
} satisfies Record<string, DriveDocument>;

/** One named test case: an engine, the generator options (without the seed) and what to expect. */
export interface Scenario {
  name: string;
  drive: DriveDocument;
  options: Omit<GenerateOptionsInput, 'drive' | 'seed'>;
  /** Parts whose whole line pattern equals the planted part's (the ranking must name them). */
  indistinguishableFrom: string[];
  /** What the scenario exercises, for test names and the accuracy table. */
  notes: string;
}

const short = { durationS: 6, sampleRateHz: 24000 } as const;

/** The scenario set (at least six components, all six fault kinds, three engines). */
export const scenarios: readonly Scenario[] = [
  {
    name: 'i4-alternator-outer-race', drive: drives.i4Petrol, indistinguishableFrom: [],
    notes: 'alternator (ratio 2.68), inner ring turning: unmodulated BPFO; cylinder-1 reference',
    options: { ...short, refKind: 'cyl1', tdcOffsetDeg: 8, fault: { component: 'Alternator', fault: 'outer_race' }, creepPct: 1, snrDb: 3 },
  },
  {
    name: 'i4-water-pump-inner-race', drive: drives.i4Petrol, indistinguishableFrom: [],
    notes: 'water pump beside a power steering pump of near-equal ratio (1.119 vs 1.145); wasted-spark reference',
    options: { ...short, refKind: 'per-rev', tdcOffsetDeg: 10, fault: { component: 'Water pump', fault: 'inner_race' }, creepPct: 2, snrDb: 0 },
  },
  {
    name: 'i4-power-steering-shaft', drive: drives.i4Petrol, indistinguishableFrom: [],
    notes: 'shaft fault on the near-equal-ratio pump, 2.5 % creep, −3 dB; 60-2 wheel',
    options: { ...short, refKind: 'wheel', wheel: '60-2', tdcOffsetDeg: 84, fault: { component: 'Power steering pump', fault: 'shaft' }, creepPct: 2.5, snrDb: -3 },
  },
  {
    name: 'i4-upper-idler-outer-race', drive: drives.i4Petrol, indistinguishableFrom: [],
    notes: 'backside idler, outer ring turning: BPFO modulated at the pulley 1×; per-cylinder reference with cam; tick-train distractor',
    options: { ...short, refKind: 'per-cylinder', camChannel: true, fault: { component: 'Upper idler', fault: 'outer_race' }, creepPct: 1.5, snrDb: 0, distractor: { kind: 'tick-train' } },
  },
  {
    name: 'i4-tensioner-cage', drive: drives.i4Petrol, indistinguishableFrom: [],
    notes: 'tensioner with entered factors, cage fault at FTF; held 1500 rpm',
    options: { ...short, rpm: 1500, refKind: 'cyl1', fault: { component: 'Tensioner', fault: 'cage' }, creepPct: 1, snrDb: 6 },
  },
  {
    name: 'v6-ac-compressor-ball', drive: drives.v6Petrol, indistinguishableFrom: [],
    notes: 'A/C compressor on a second belt driven by the power steering pump; ball fault (2×BSF ± FTF); 3 % creep',
    options: { ...short, refKind: 'cyl1', tdcOffsetDeg: 12, fault: { component: 'A/C compressor', fault: 'ball' }, creepPct: 3, snrDb: 3 },
  },
  {
    name: 'v6-idler-a-outer-race', drive: drives.v6Petrol, indistinguishableFrom: ['Idler B'],
    notes: 'Idler A and Idler B share ratio and bearing: truly indistinguishable; wasted-spark reference',
    options: { ...short, refKind: 'per-rev', fault: { component: 'Idler A', fault: 'outer_race' }, creepPct: 1, snrDb: 3 },
  },
  {
    name: 'v6-front-belt', drive: drives.v6Petrol, indistinguishableFrom: [],
    notes: 'belt fault on the front belt (belt-pass order 0.28); clunk distractor',
    options: { ...short, durationS: 10, refKind: 'cyl1', fault: { component: 'Front', fault: 'belt' }, creepPct: 1, snrDb: 6, distractor: { kind: 'clunk' } },
  },
  {
    name: 'v6-alternator-inner-race', drive: drives.v6Petrol, indistinguishableFrom: [],
    notes: 'alternator inner race (±1× shaft sidebands) at −3 dB; 36-1 wheel',
    options: { ...short, refKind: 'wheel', wheel: '36-1', tdcOffsetDeg: 60, fault: { component: 'Alternator', fault: 'inner_race' }, creepPct: 1.5, snrDb: -3 },
  },
  {
    name: 'diesel-vacuum-pump-outer-race', drive: drives.i4Diesel, indistinguishableFrom: [],
    notes: 'cam-driven vacuum pump at fixedRatio 0.5 (no creep); 60-2 wheel with cam channel',
    options: { ...short, refKind: 'wheel', wheel: '60-2', camChannel: true, tdcOffsetDeg: 90, fault: { component: 'Vacuum pump', fault: 'outer_race' }, snrDb: 0 },
  },
  {
    name: 'diesel-alternator-shaft', drive: drives.i4Diesel, indistinguishableFrom: [],
    notes: 'alternator shaft fault with 3 % creep at 0 dB; clunk distractor',
    options: { ...short, refKind: 'cyl1', fault: { component: 'Alternator', fault: 'shaft' }, creepPct: 3, snrDb: 0, distractor: { kind: 'clunk' } },
  },
  {
    name: 'diesel-backside-idler-inner-race', drive: drives.i4Diesel, indistinguishableFrom: [],
    notes: 'backside idler, outer ring turning: the fixed inner race gives an unmodulated BPFI lowered by slip; tick-train distractor',
    options: { ...short, refKind: 'per-rev', tdcOffsetDeg: 6, fault: { component: 'Backside idler', fault: 'inner_race' }, creepPct: 1, snrDb: 3, distractor: { kind: 'tick-train' } },
  },
  {
    name: 'diesel-water-pump-ball', drive: drives.i4Diesel, indistinguishableFrom: [],
    notes: 'water pump (6205 by designation) ball fault at −3 dB; per-cylinder reference',
    options: { ...short, refKind: 'per-cylinder', fault: { component: 'Water pump', fault: 'ball' }, creepPct: 2, snrDb: -3 },
  },
];

/**
 * Generates a scenario's capture for one seed. `overrides` replace options (e.g. a longer
 * duration for `npm run accuracy`).
 */
export function makeScenarioCapture(scenario: Scenario, seed: number, overrides: Omit<GenerateOptionsInput, 'drive' | 'seed'> = {}): GeneratedCapture {
  return generateCapture({ ...scenario.options, ...overrides, drive: scenario.drive, seed });
}
