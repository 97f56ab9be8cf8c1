/**
 * Rules across the fields of a drive document that a per-field schema cannot check: unique names,
 * the firing order as a permutation, exactly one crankshaft, belts chained to the crank, pulleys
 * where belts need them, ball below pitch diameter. Reads the raw JSON defensively so that every
 * violation is reported together with the schema's field errors (shared/schemas/drive.ts).
 */

/** One violation: a JSON path such as `components[2].pulleyMm` ("$" for the document) and what to fix. */
export interface DriveIssue { path: string; message: string }

type Rec = Record<string, unknown>;
const isRec = (v: unknown): v is Rec => typeof v === 'object' && v !== null && !Array.isArray(v);
const str = (v: unknown): string | undefined => (typeof v === 'string' && v.trim() !== '' ? v.trim() : undefined);
const key = (s: string): string => s.trim().toLowerCase();

function firingOrderIssues(doc: Rec): DriveIssue[] {
  const cylinders = doc.cylinders;
  const order = doc.firingOrder;
  if (!(typeof cylinders === 'number' && Number.isInteger(cylinders) && cylinders >= 1) || !Array.isArray(order)) return [];
  const sorted = [...order].sort((a, b) => Number(a) - Number(b));
  const ok = order.length === cylinders && sorted.every((v, i) => v === i + 1);
  if (ok) return [];
  return [{
    path: 'firingOrder',
    message: `firingOrder must list each cylinder from 1 to ${cylinders} exactly once (got ${JSON.stringify(order)})`,
  }];
}

function uniqueNameIssues(items: unknown[], listName: string, what: string): DriveIssue[] {
  const seen = new Map<string, number>();
  const issues: DriveIssue[] = [];
  items.forEach((item, i) => {
    const name = isRec(item) ? str(item.name) : undefined;
    if (!name) return;
    const first = seen.get(key(name));
    if (first !== undefined) {
      issues.push({ path: `${listName}[${i}].name`, message: `${what} name "${name}" is already used by ${listName}[${first}] (names are compared ignoring case)` });
    } else seen.set(key(name), i);
  });
  return issues;
}

function bearingIssues(bearing: unknown, path: string): DriveIssue[] {
  if (!isRec(bearing)) return [];
  const issues: DriveIssue[] = [];
  const geometry = ['balls', 'ballMm', 'pitchMm'].filter((k) => bearing[k] !== undefined);
  if (geometry.length > 0 && geometry.length < 3) {
    issues.push({ path, message: 'give the bearing geometry as balls, ballMm and pitchMm together (or a designation, or factors)' });
  }
  if (typeof bearing.ballMm === 'number' && typeof bearing.pitchMm === 'number' && bearing.ballMm >= bearing.pitchMm) {
    issues.push({ path: `${path}.ballMm`, message: `ballMm (${bearing.ballMm}) must be smaller than pitchMm (${bearing.pitchMm})` });
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
      if (belt) issues.push({ path: `${at}.belt`, message: 'the crankshaft drives belts (name it as a belt\'s driver); it does not ride one' });
      if (hasFixed) issues.push({ path: `${at}.fixedRatio`, message: 'the crankshaft is the reference (ratio 1); remove fixedRatio' });
    } else {
      if (belt && hasFixed) issues.push({ path: `${at}.fixedRatio`, message: 'a fixed-ratio part rides no belt: remove either belt or fixedRatio' });
      if (!belt && !hasFixed) issues.push({ path: at, message: 'a part needs a belt (with its pulleyMm) or a fixedRatio (gear, cam or timing-belt drive)' });
      if (belt && !beltNames.has(key(belt))) issues.push({ path: `${at}.belt`, message: `belt "${belt}" is not among the drive's belts` });
      if (belt && c.pulleyMm === undefined) issues.push({ path: `${at}.pulleyMm`, message: 'a part on a belt needs its effective pulley diameter pulleyMm' });
      if (c.backside === true && !belt) issues.push({ path: `${at}.backside`, message: 'backside applies only to a part riding a belt' });
    }
    issues.push(...bearingIssues(c.bearing, `${at}.bearing`));
  });
  if (cranks.length === 0) issues.push({ path: 'components', message: 'the drive needs exactly one component of kind "crankshaft"; none found' });
  for (const i of cranks.slice(1)) {
    issues.push({ path: `components[${i}].kind`, message: `the drive needs exactly one crankshaft; components[${cranks[0]}] is already one` });
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
      issues.push({ path: `belts[${i}].driver`, message: `driver "${driver}" is not among the components; name the part whose groove drives this belt` });
    } else if (!rootedBelts.has(key(name))) {
      issues.push({ path: `belts[${i}].driver`, message: `belt "${name}" is driven by "${driver}", which is not driven from the crankshaft (the chain loops or breaks); every belt must trace back to the crankshaft` });
    }
  });
  return issues;
}

/** All cross-field violations of a raw (JSON-parsed) drive document; [] when it is not even an object. */
export function driveDocumentRuleIssues(json: unknown): DriveIssue[] {
  if (!isRec(json)) return [{ path: '$', message: 'a drive document must be a JSON object with name, cylinders, firingOrder, belts and components' }];
  const belts = Array.isArray(json.belts) ? json.belts : [];
  const components = Array.isArray(json.components) ? json.components : [];
  const beltNames = new Set(belts.filter(isRec).map((b) => str(b.name)).filter((n): n is string => !!n).map(key));
  const componentNames = new Set(components.filter(isRec).map((c) => str(c.name)).filter((n): n is string => !!n).map(key));
  const issues = [
    ...firingOrderIssues(json),
    ...uniqueNameIssues(components, 'components', 'component'),
    ...uniqueNameIssues(belts, 'belts', 'belt'),
  ];
  belts.forEach((b, i) => {
    const name = isRec(b) ? str(b.name) : undefined;
    if (name && componentNames.has(key(name))) {
      issues.push({ path: `belts[${i}].name`, message: `belt name "${name}" is also a component's name; suspects are named by it, so give the belt its own name` });
    }
  });
  issues.push(...componentIssues(components, beltNames), ...chainIssues(belts, components));
  return issues;
}
