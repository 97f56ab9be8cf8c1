/**
 * A schematic layout of an accessory drive for the belt sketch: where each pulley sits and the
 * path of each belt (tangent lines and arcs). Real pulley positions are not in the drive table, so
 * each belt's pulleys are placed evenly around a circle in table order, driver at the bottom;
 * backside pulleys sit further in, so the belt bends round them on its back. A belt driven by a
 * part other than the first belt's driver, or a second groove, gets its own circle beside it.
 * Geometry: for consecutive pulleys i → j with signed radii ρ (positive = belt's inside face on the
 * pulley, negative = backside), the belt's left normal n satisfies n·(c_j − c_i) = ρ_j − ρ_i.
 */
import type { DriveDocument } from '../../../../shared/drive/types';

/** A pulley (or groove) drawn on the sketch. Coordinates in millimetres, y downwards. */
export interface SketchPulley {
  component: string;
  belt: string;
  x: number;
  y: number;
  r: number;
  backside: boolean;
  driver: boolean;
}

/** One belt's closed path as an SVG path string and its pulleys in loop order. */
export interface SketchBelt {
  name: string;
  index: number;
  /** Centre of the circle the pulleys were placed on (labels go outwards from it). */
  centre: { x: number; y: number };
  path: string;
  pulleys: SketchPulley[];
}

/** The whole sketch: belts, and a bounding box to set the SVG viewBox from. */
export interface SketchLayout {
  belts: SketchBelt[];
  /** Parts on no belt (fixed ratio), listed beside the sketch. */
  unbelted: string[];
  box: { x: number; y: number; width: number; height: number };
}

interface Point { x: number; y: number }

const key = (s: string) => s.trim().toLowerCase();

/** Tangent points from circle a to circle b for signed radii (see the module comment). */
export function tangent(a: Point & { rho: number }, b: Point & { rho: number }): [Point, Point] | null {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  const len = Math.hypot(dx, dy);
  const c = (b.rho - a.rho) / len;
  if (!(len > 0) || Math.abs(c) > 1) return null;
  const phi = Math.atan2(dy, dx) + Math.acos(c);
  const n = { x: Math.cos(phi), y: Math.sin(phi) };
  return [
    { x: a.x - a.rho * n.x, y: a.y - a.rho * n.y },
    { x: b.x - b.rho * n.x, y: b.y - b.rho * n.y },
  ];
}

const fmt = (v: number) => Number(v.toFixed(2));

function beltPath(pulleys: SketchPulley[]): string {
  const n = pulleys.length;
  if (n < 2) return '';
  const circles = pulleys.map((p) => ({ x: p.x, y: p.y, rho: p.backside ? -p.r : p.r }));
  const spans: ([Point, Point] | null)[] = circles.map((c, i) => tangent(c, circles[(i + 1) % n]));
  if (spans.some((s) => s === null)) {
    // Overlapping circles: fall back to a polygon through the centres.
    return `M ${pulleys.map((p) => `${fmt(p.x)} ${fmt(p.y)}`).join(' L ')} Z`;
  }
  const s = spans as [Point, Point][];
  let d = `M ${fmt(s[n - 1][1].x)} ${fmt(s[n - 1][1].y)}`;
  for (let i = 0; i < n; i += 1) {
    const arrive = s[(i + n - 1) % n][1];
    const leave = s[i][0];
    const p = pulleys[i];
    // Angle swept around the pulley, in the loop's sense for a front pulley, the other way for a backside one.
    const a0 = Math.atan2(arrive.y - p.y, arrive.x - p.x);
    const a1 = Math.atan2(leave.y - p.y, leave.x - p.x);
    let sweep = p.backside ? a0 - a1 : a1 - a0;
    while (sweep < 0) sweep += 2 * Math.PI;
    const large = sweep > Math.PI ? 1 : 0;
    d += ` A ${fmt(p.r)} ${fmt(p.r)} 0 ${large} ${p.backside ? 0 : 1} ${fmt(leave.x)} ${fmt(leave.y)}`;
    const next = s[i][1];
    d += ` L ${fmt(next.x)} ${fmt(next.y)}`;
  }
  return `${d} Z`;
}

/**
 * Lays out every belt of a drive. Pulleys without a usable diameter are drawn at 60 mm. Works on
 * incomplete drafts: unknown belts and drivers are skipped rather than thrown on.
 */
export function layoutDrive(doc: Pick<DriveDocument, 'belts' | 'components'>): SketchLayout {
  const centres = new Map<string, Point>();
  const belts: SketchBelt[] = [];
  let sideStep = 0;
  let firstCentre: Point | null = null;
  const firstDriver = doc.belts[0] ? key(doc.belts[0].driver) : '';
  doc.belts.forEach((belt, index) => {
    const riders = doc.components.filter((c) => c.belt !== undefined && key(c.belt) === key(belt.name));
    const driverName = doc.components.find((c) => key(c.name) === key(belt.driver))?.name ?? belt.driver;
    const dia = (v: number | undefined) => (v !== undefined && Number.isFinite(v) && v > 0 ? v : 60);
    const members = [{ name: driverName, d: dia(belt.driverPulleyMm), backside: false, driver: true },
      ...riders.map((c) => ({ name: c.name, d: dia(c.pulleyMm), backside: Boolean(c.backside), driver: false }))];
    const sumD = members.reduce((s, m) => s + m.d, 0);
    const maxD = Math.max(...members.map((m) => m.d));
    const radius = Math.max((1.5 * sumD) / (2 * Math.PI), maxD * 1.15, 110);
    const driverAt = centres.get(key(driverName)) ?? { x: 0, y: 0 };
    // The first belt's loop sits above its driver. Each further loop goes outwards from the first
    // loop's centre through its driver (straight below the crank for a second groove, then to either
    // side; straight out for a belt driven by a driven part), so the loops do not overlap.
    let centre: Point;
    if (!firstCentre) {
      centre = { x: driverAt.x, y: driverAt.y - radius };
      firstCentre = centre;
    } else {
      const dx = driverAt.x - firstCentre.x;
      const dy = driverAt.y - firstCentre.y;
      const len = Math.hypot(dx, dy) || 1;
      let ux = dx / len;
      let uy = dy / len;
      if (key(driverName) === firstDriver) {
        // Straight below the crank first, then to either side.
        const turn = ([0, 60, -60][sideStep % 3] * Math.PI) / 180;
        sideStep += 1;
        [ux, uy] = [ux * Math.cos(turn) - uy * Math.sin(turn), ux * Math.sin(turn) + uy * Math.cos(turn)];
      }
      const reach = radius + (members[0].d / 2) * 0.2;
      centre = { x: driverAt.x + ux * reach, y: driverAt.y + uy * reach };
    }
    const base = Math.atan2(driverAt.y - centre.y, driverAt.x - centre.x);
    const pulleys: SketchPulley[] = members.map((m, i) => {
      if (i === 0) return { component: m.name, belt: belt.name, x: driverAt.x, y: driverAt.y, r: m.d / 2, backside: false, driver: true };
      // Table order runs round the loop against the driver's start angle (decreasing angle = anticlockwise on screen).
      const angle = base - (2 * Math.PI * i) / members.length;
      const rr = m.backside ? radius * 0.55 : radius;
      const p = { component: m.name, belt: belt.name, x: centre.x + rr * Math.cos(angle), y: centre.y + rr * Math.sin(angle), r: m.d / 2, backside: m.backside, driver: false };
      if (!centres.has(key(m.name))) centres.set(key(m.name), { x: p.x, y: p.y });
      return p;
    });
    if (!centres.has(key(driverName))) centres.set(key(driverName), driverAt);
    // Traverse in decreasing screen angle = the loop's positive (left-interior) sense for y-down coordinates.
    belts.push({ name: belt.name, index, centre, path: beltPath(pulleys.slice().reverse()), pulleys });
  });
  const all = belts.flatMap((b) => b.pulleys);
  // Room for the labels written outwards from each loop.
  const pad = 150;
  const minX = Math.min(0, ...all.map((p) => p.x - p.r)) - pad;
  const maxX = Math.max(0, ...all.map((p) => p.x + p.r)) + pad;
  const minY = Math.min(0, ...all.map((p) => p.y - p.r)) - pad;
  const maxY = Math.max(0, ...all.map((p) => p.y + p.r)) + pad;
  const unbelted = doc.components.filter((c) => c.kind !== 'crankshaft' && !c.belt).map((c) => c.name);
  return { belts, unbelted, box: { x: minX, y: minY, width: maxX - minX, height: maxY - minY } };
}
