/**
 * Pulley kinematics of an accessory drive: speed ratios along belt chains, belt speed and
 * belt-pass order. Ratios are nominal (no creep): driven speed = driver speed × D_driver / D_driven
 * (docs/references.md §5; effective, pitch-line diameters). A backside pulley turns the other way; its
 * ratio magnitude is the same, so ratios here are magnitudes. An order is a multiple of crank speed.
 */
import type { BeltSpec, ComponentSpec, DriveDocument } from './types';

/** The drive's component of a name (trimmed, ignoring case), or undefined. */
export function findComponent(drive: DriveDocument, name: string): ComponentSpec | undefined {
  const key = name.trim().toLowerCase();
  return drive.components.find((c) => c.name.trim().toLowerCase() === key);
}

/** The drive's belt of a name (trimmed, ignoring case), or undefined. */
export function findBelt(drive: DriveDocument, name: string): BeltSpec | undefined {
  const key = name.trim().toLowerCase();
  return drive.belts.find((b) => b.name.trim().toLowerCase() === key);
}

function ratioOf(drive: DriveDocument, name: string, visiting: Set<string>): number {
  const component = findComponent(drive, name);
  if (!component) throw new RangeError(`no component named "${name}" in drive "${drive.name}"`);
  if (component.kind === 'crankshaft') return 1;
  if (component.fixedRatio !== undefined) return component.fixedRatio;
  if (!component.belt) throw new RangeError(`component "${component.name}" has neither a belt nor a fixedRatio`);
  const belt = findBelt(drive, component.belt);
  if (!belt) throw new RangeError(`component "${component.name}" names belt "${component.belt}", which the drive lacks`);
  if (!(component.pulleyMm !== undefined && component.pulleyMm > 0)) {
    throw new RangeError(`component "${component.name}" rides belt "${belt.name}" but has no pulleyMm`);
  }
  const key = component.name.toLowerCase();
  if (visiting.has(key)) throw new RangeError(`belt chain through "${component.name}" loops back on itself`);
  visiting.add(key);
  const driverRatio = ratioOf(drive, belt.driver, visiting);
  visiting.delete(key);
  return (driverRatio * belt.driverPulleyMm) / component.pulleyMm;
}

/**
 * Nominal speed ratio (part speed / crank speed, a magnitude) of a component:
 * Π(belt.driverPulleyMm / driven.pulleyMm) along the chain from the crank, or `fixedRatio` as
 * given; 1 for the crankshaft. Throws RangeError for an unknown name or a broken chain.
 */
export function speedRatio(drive: DriveDocument, componentName: string): number {
  return ratioOf(drive, componentName, new Set());
}

/**
 * Whether a component turns opposite to the crank: each backside pulley along its chain flips
 * the direction (a fixed-ratio part is reported as turning with the crank).
 */
export function turnsBackwards(drive: DriveDocument, componentName: string): boolean {
  let flips = 0;
  let component = findComponent(drive, componentName);
  const seen = new Set<string>();
  while (component && component.kind !== 'crankshaft' && component.belt && component.fixedRatio === undefined) {
    if (seen.has(component.name.toLowerCase())) break;
    seen.add(component.name.toLowerCase());
    if (component.backside) flips += 1;
    const belt = findBelt(drive, component.belt);
    component = belt ? findComponent(drive, belt.driver) : undefined;
  }
  return flips % 2 === 1;
}

/**
 * Number of friction-belt stages between the crank and a component (each adds belt creep):
 * 0 for the crankshaft and fixed-ratio parts, 1 on a crank-driven belt, 2 on a belt driven by a
 * belt-driven part, and so on.
 */
export function beltStages(drive: DriveDocument, componentName: string): number {
  let stages = 0;
  let component = findComponent(drive, componentName);
  const seen = new Set<string>();
  while (component && component.kind !== 'crankshaft' && component.fixedRatio === undefined && component.belt) {
    const key = component.name.toLowerCase();
    if (seen.has(key)) break;
    seen.add(key);
    stages += 1;
    const belt = findBelt(drive, component.belt);
    component = belt ? findComponent(drive, belt.driver) : undefined;
  }
  return stages;
}

function beltOrThrow(drive: DriveDocument, beltName: string): BeltSpec {
  const belt = findBelt(drive, beltName);
  if (!belt) throw new RangeError(`no belt named "${beltName}" in drive "${drive.name}"`);
  return belt;
}

/**
 * Belt speed in m/s at a crank speed: v = π·D·f of the belt's driving groove, where f is the
 * driver's speed (crank speed × the driver's ratio) and D its groove's effective diameter
 * (docs/references.md §5: D 160 mm at 750 rpm → 6.2832 m/s).
 */
export function beltSpeedMs(drive: DriveDocument, beltName: string, crankRpm: number): number {
  if (!(Number.isFinite(crankRpm) && crankRpm >= 0)) throw new RangeError(`crank speed must be a non-negative rpm, got ${crankRpm}`);
  const belt = beltOrThrow(drive, beltName);
  const driverHz = (crankRpm / 60) * speedRatio(drive, belt.driver);
  return Math.PI * (belt.driverPulleyMm / 1000) * driverHz;
}

/**
 * Belt-pass order: how many times a point on the belt passes per crank revolution,
 * π·D_driver·ratio(driver) / L (docs/references.md §5: D 160 mm, L 1900 mm → 0.26456).
 */
export function beltPassOrder(drive: DriveDocument, beltName: string): number {
  const belt = beltOrThrow(drive, beltName);
  return (Math.PI * belt.driverPulleyMm * speedRatio(drive, belt.driver)) / belt.lengthMm;
}
