/**
 * Rules across the fields of a drive document that a per-field schema cannot check: unique names
 * (ignoring case and accents, as the database's collation compares them), the firing order as a
 * permutation, exactly one crankshaft, belts chained to the crank in at most 4 stages, every ratio
 * 0.1–20, pulleys where belts need them, ball below pitch diameter. Reads the raw JSON defensively
 * so that every violation is reported together with the schema's field errors
 * (shared/schemas/drive.ts). Messages are in the user's words; the path says where.
 */
import { nameFoldKey } from '../schemas/names';

/** A belt drive has at most this many belt stages between the crank and a part. */
export const MAX_BELT_STAGES = 4;
/** Part speed / crank speed must lie in this range (a belt drive cannot step further). */
export const RATIO_RANGE = [0.1, 20] as const;

/** One violation: a JSON path such as `components[2].pulleyMm` ("$" for the document) and what to fix. */
export interface DriveIssue { path: string; message: string }

type Rec = Record<string, unknown>;
const isRec = (v: unknown): v is Rec => typeof v === 'object' && v !== null && !Array.isArray(v);
const str = (v: unknown): string | undefined => (typeof v === 'string' && v.trim() !== '' ? v.trim() : undefined);
/** References (a part's belt, a belt's driver) match as the kinematics match them: case-insensitively. */
const key = (s: string): string => s.trim().toLowerCase();
/** Uniqueness ignores accents too, as the database's collation does. */
const fold = (s: string): string => nameFoldKey(s);

function firingOrderIssues(doc: Rec): DriveIssue[] {
  const cylinders = doc.cylinders;
  const order = doc.firingOrder;
  if (!(typeof cylinders === 'number' && Number.isInteger(cylinders) && cylinders >= 1) || !Array.isArray(order)) return [];
  const sorted = [...order].sort((a, b) => Number(a) - Number(b));
  const ok = order.length === cylinders && sorted.every((v, i) => v === i + 1);
  if (ok) return [];
  return [{
    path: 'firingOrder',
    message: `The firing order must list each cylinder from 1 to ${cylinders} exactly once (got ${order.join('-')})`,
  }];
}

function uniqueNameIssues(items: unknown[], listName: string, what: 'part' | 'belt'): DriveIssue[] {
  const seen = new Map<string, number>();
  const issues: DriveIssue[] = [];
  items.forEach((item, i) => {
    const name = isRec(item) ? str(item.name) : undefined;
    if (!name) return;
    const first = seen.get(fold(name));
    if (first !== undefined) {
      issues.push({ path: `${listName}[${i}].name`, message: `Another ${what} (row ${first + 1}) already has the name "${name}" (names are compared ignoring case and accents)` });
    } else seen.set(fold(name), i);
  });
  return issues;
}

function bearingIssues(bearing: unknown, path: string): DriveIssue[] {
  if (!isRec(bearing)) return [];
  const issues: DriveIssue[] = [];
  const geometry = ['balls', 'ballMm', 'pitchMm'].filter((k) => bearing[k] !== undefined);
  if (geometry.length > 0 && geometry.length < 3) {
    issues.push({ path, message: 'Give the number of balls, the ball diameter and the pitch diameter together (or a designation, or the factors)' });
  }
  if (typeof bearing.ballMm === 'number' && typeof bearing.pitchMm === 'number' && bearing.ballMm >= bearing.pitchMm) {
    issues.push({ path: `${path}.ballMm`, message: `The ball diameter (${bearing.ballMm} mm) must be smaller than the pitch diameter (${bearing.pitchMm} mm)` });
  }
  return issues;
}

function componentIssues(components: unknown[], beltNames: Set<string>): DriveIssue[] {
  const issues: DriveIssue[] = [];
  const cranks: number[] = [];
  components.forEach((c, i) => {
    if (!isRec(c)) return;
    const at = `components[${i}]`;
    const belt = str(c.belt);
    const hasFixed = c.fixedRatio !== undefined;
    if (c.kind === 'crankshaft') {
      cranks.push(i);
      if (belt) issues.push({ path: `${at}.belt`, message: 'The crankshaft drives belts (choose it as a belt\'s driver); it does not ride one: leave its belt empty' });
      if (hasFixed) issues.push({ path: `${at}.fixedRatio`, message: 'The crankshaft is the reference (ratio 1); leave its fixed ratio empty' });
    } else {
      if (belt && hasFixed) issues.push({ path: `${at}.fixedRatio`, message: 'A part with a fixed ratio rides no belt: clear either the belt or the fixed ratio' });
      if (!belt && !hasFixed) issues.push({ path: at, message: 'Choose the belt this part rides (and its pulley diameter), or give a fixed ratio for a gear, cam or timing-belt drive' });
      if (belt && !beltNames.has(key(belt))) issues.push({ path: `${at}.belt`, message: `There is no belt named "${belt}" on this engine; add it under Belts or choose another` });
      if (belt && c.pulleyMm === undefined) issues.push({ path: `${at}.pulleyMm`, message: 'Enter the pulley diameter of this part (it rides a belt)' });
      if (c.backside === true && !belt) issues.push({ path: `${at}.backside`, message: 'Backside applies only to a part riding a belt' });
    }
    issues.push(...bearingIssues(c.bearing, `${at}.bearing`));
  });
  if (cranks.length === 0) issues.push({ path: 'components', message: 'The drive needs one part of kind Crankshaft; add it' });
  for (const i of cranks.slice(1)) {
    issues.push({ path: `components[${i}].kind`, message: `The drive has only one crankshaft; row ${cranks[0] + 1} is already it` });
  }
  return issues;
}

/** Belts chained to the crank: every driver exists, and following drivers reaches the crank or a fixed-ratio part (no loops). */
function chainIssues(belts: unknown[], components: unknown[]): DriveIssue[] {
  const issues: DriveIssue[] = [];
  const byName = new Map<string, Rec>();
  for (const c of components) if (isRec(c) && str(c.name)) byName.set(key(str(c.name)!), c);
  const rooted = new Set<string>();
  for (const [name, c] of byName) if (c.kind === 'crankshaft' || (c.fixedRatio !== undefined && !str(c.belt))) rooted.add(name);
  const beltDriver = new Map<string, string>();
  belts.forEach((b) => { if (isRec(b) && str(b.name) && str(b.driver)) beltDriver.set(key(str(b.name)!), key(str(b.driver)!)); });
  const rootedBelts = new Set<string>();
  for (let changed = true; changed;) {
    changed = false;
    for (const [belt, driver] of beltDriver) {
      if (rootedBelts.has(belt) || !rooted.has(driver)) continue;
      rootedBelts.add(belt);
      changed = true;
      for (const [name, c] of byName) if (str(c.belt) && key(str(c.belt)!) === belt) rooted.add(name);
    }
  }
  belts.forEach((b, i) => {
    if (!isRec(b)) return;
    const driver = str(b.driver);
    const name = str(b.name);
    if (!driver || !name) return;
    if (!byName.has(key(driver))) {
      issues.push({ path: `belts[${i}].driver`, message: `There is no part named "${driver}"; choose the part whose groove drives this belt` });
    } else if (!rootedBelts.has(key(name))) {
      issues.push({ path: `belts[${i}].driver`, message: `Belt "${name}" is driven by "${driver}", which is not driven from the crankshaft (the chain loops or breaks); every belt must lead back to the crankshaft` });
    }
  });
  return issues;
}

/** All cross-field violations of a raw (JSON-parsed) drive document; [] when it is not even an object. */
export function driveDocumentRuleIssues(json: unknown): DriveIssue[] {
  if (!isRec(json)) return [{ path: '$', message: 'A drive document is a JSON object with name, cylinders, firingOrder, belts and components' }];
  const belts = Array.isArray(json.belts) ? json.belts : [];
  const components = Array.isArray(json.components) ? json.components : [];
  const beltNames = new Set(belts.filter(isRec).map((b) => str(b.name)).filter((n): n is string => !!n).map(key));
  const componentNames = new Set(components.filter(isRec).map((c) => str(c.name)).filter((n): n is string => !!n).map(fold));
  const issues = [
    ...firingOrderIssues(json),
    ...uniqueNameIssues(components, 'components', 'part'),
    ...uniqueNameIssues(belts, 'belts', 'belt'),
  ];
  belts.forEach((b, i) => {
    const name = isRec(b) ? str(b.name) : undefined;
    if (name && componentNames.has(fold(name))) {
      issues.push({ path: `belts[${i}].name`, message: `"${name}" is also a part's name; suspects are named by it, so give the belt its own name` });
    }
  });
  issues.push(...componentIssues(components, beltNames), ...chainIssues(belts, components));
  if (issues.length === 0) issues.push(...stageAndRatioIssues(belts, components));
  return issues;
}

/**
 * Belt stages and overall ratio of every part, on a document whose chains are already sound:
 * at most MAX_BELT_STAGES belts between the crank and a part, and a ratio in RATIO_RANGE.
 */
function stageAndRatioIssues(belts: unknown[], components: unknown[]): DriveIssue[] {
  const byName = new Map<string, Rec>();
  for (const c of components) if (isRec(c) && str(c.name)) byName.set(key(str(c.name)!), c);
  const beltByName = new Map<string, Rec>();
  for (const b of belts) if (isRec(b) && str(b.name)) beltByName.set(key(str(b.name)!), b);
  const memo = new Map<string, { stages: number; ratio: number }>();
  const walk = (name: string, depth: number): { stages: number; ratio: number } => {
    const known = memo.get(name);
    if (known) return known;
    const c = byName.get(name);
    let out = { stages: 0, ratio: 1 };
    if (c && c.kind !== 'crankshaft') {
      if (typeof c.fixedRatio === 'number' && !str(c.belt)) out = { stages: 0, ratio: c.fixedRatio };
      else {
        const belt = str(c.belt) ? beltByName.get(key(str(c.belt)!)) : undefined;
        const driver = belt && str(belt.driver) ? key(str(belt.driver)!) : undefined;
        if (belt && driver && depth < 64 && typeof belt.driverPulleyMm === 'number' && typeof c.pulleyMm === 'number' && c.pulleyMm > 0) {
          const up = walk(driver, depth + 1);
          out = { stages: up.stages + 1, ratio: (up.ratio * belt.driverPulleyMm) / c.pulleyMm };
        }
      }
    }
    memo.set(name, out);
    return out;
  };
  const issues: DriveIssue[] = [];
  components.forEach((c, i) => {
    if (!isRec(c) || !str(c.name) || c.kind === 'crankshaft') return;
    const { stages, ratio } = walk(key(str(c.name)!), 0);
    if (stages > MAX_BELT_STAGES) {
      issues.push({ path: `components[${i}].belt`, message: `This part is ${stages} belts away from the crankshaft; a belt drive has at most ${MAX_BELT_STAGES} stages` });
    } else if (Number.isFinite(ratio) && (ratio < RATIO_RANGE[0] || ratio > RATIO_RANGE[1])) {
      const field = typeof c.fixedRatio === 'number' && !str(c.belt) ? 'fixedRatio' : 'pulleyMm';
      issues.push({
        path: `components[${i}].${field}`,
        message: `This part would turn ${Number(ratio.toPrecision(3))} times as fast as the crankshaft; a belt drive gives ${RATIO_RANGE[0]} to ${RATIO_RANGE[1]}: check the pulley diameters`,
      });
    }
  });
  return issues;
}
