/**
 * The engine page's editable draft (the react-hook-form values): every cell as the text the user
 * typed, so that a half-typed number stays on screen. `draftToDocument` turns it into a drive
 * document and collects a message per cell for anything that is not a number; the drive schema
 * (shared/schemas/drive.ts) then checks the rest, and its JSON paths (`components[2].pulleyMm`)
 * are mapped to the form's field names (`components.2.pulleyMm`) by `formPathOf`.
 *
 * A pulley is entered either as its effective diameter or as the outside diameter a technician
 * measures; the effective one is then outside + the shop's offset (shared/drive/measured-diameter.ts).
 * Pulleys may be entered in inches (Shop setup); documents are always in millimetres.
 */
import { effectiveFromOutside, MM_PER_INCH, DEFAULT_OFFSETS, cleanNumber, type DiameterOffsets } from '../../../../shared/drive/measured-diameter';
import type { BearingSpec, ComponentKind, ComponentSpec, DriveDocument, RotatingRing } from '../../../../shared/drive/types';
import { DriveDocumentError, parseDriveDocument } from '../../../../shared/schemas/drive';
import type { PulleyUnit } from '../../../../shared/schemas/shop-settings';

/** How pulleys are read and shown: the shop's unit and its measured-diameter offsets. */
export interface PulleyOptions extends DiameterOffsets { unit: PulleyUnit }
/** Millimetres and the estimated default offsets. */
export const DEFAULT_PULLEY_OPTIONS: PulleyOptions = { unit: 'mm', ...DEFAULT_OFFSETS };

const toUnit = (mm: number | undefined, unit: PulleyUnit): string => (mm === undefined ? '' : String(unit === 'inch' ? cleanNumber(Number((mm / MM_PER_INCH).toFixed(4))) : mm));
const fromUnit = (v: number, unit: PulleyUnit): number => (unit === 'inch' ? cleanNumber(v * MM_PER_INCH) : v);

/** One component row as typed. */
export interface DraftComponent {
  id: string;
  name: string;
  kind: ComponentKind;
  belt: string;
  /** Which diameter the user enters: the effective one, or the outside one measured with calipers. */
  pulleyBasis: 'effective' | 'outside';
  pulleyMm: string;
  outsideMm: string;
  backside: boolean;
  fixedRatio: string;
  overrunning: boolean;
  designation: string;
  balls: string;
  ballMm: string;
  pitchMm: string;
  contactDeg: string;
  ftf: string;
  bpfo: string;
  bpfi: string;
  bsf: string;
  rotatingRing: '' | RotatingRing;
  source: '' | 'published' | 'measured' | 'estimated';
}

/** One belt row as typed. */
export interface DraftBelt {
  id: string;
  name: string;
  lengthMm: string;
  driver: string;
  driverPulleyMm: string;
}

/** The whole engine as typed. */
export interface EngineDraft {
  name: string;
  cylinders: string;
  firingOrder: string;
  idleRpm: string;
  notes: string;
  belts: DraftBelt[];
  components: DraftComponent[];
}

/** Messages keyed by JSON path, e.g. `components[2].pulleyMm`, `belts[0].driver`, `name`. */
export type FieldErrors = Record<string, string>;

let nextId = 0;
/** A fresh row id for React keys (not stored). */
export const rowId = (): string => `row-${(nextId += 1)}`;

const text = (v: number | undefined): string => (v === undefined ? '' : String(v));

/** An empty component row. */
export function emptyComponent(kind: ComponentKind = 'other', belt = ''): DraftComponent {
  return {
    id: rowId(), name: '', kind, belt, pulleyBasis: 'effective', pulleyMm: '', outsideMm: '', backside: false, fixedRatio: '', overrunning: false, designation: '',
    balls: '', ballMm: '', pitchMm: '', contactDeg: '', ftf: '', bpfo: '', bpfi: '', bsf: '', rotatingRing: '', source: '',
  };
}

/** An empty belt row. */
export function emptyBelt(driver = ''): DraftBelt {
  return { id: rowId(), name: '', lengthMm: '', driver, driverPulleyMm: '' };
}

/** The draft of a new engine: a four-cylinder with its crankshaft. */
export function newEngineDraft(): EngineDraft {
  return {
    name: '', cylinders: '4', firingOrder: '1-3-4-2', idleRpm: '750', notes: '', belts: [],
    components: [{ ...emptyComponent('crankshaft'), name: 'Crankshaft' }],
  };
}

/** The draft of a stored document. */
export function documentToDraft(doc: DriveDocument & { notes?: string }, unit: PulleyUnit = 'mm'): EngineDraft {
  return {
    name: doc.name, cylinders: String(doc.cylinders), firingOrder: doc.firingOrder.join('-'), idleRpm: text(doc.idleRpm),
    notes: doc.notes ?? '',
    belts: doc.belts.map((b) => ({ id: rowId(), name: b.name, lengthMm: text(b.lengthMm), driver: b.driver, driverPulleyMm: toUnit(b.driverPulleyMm, unit) })),
    components: doc.components.map((c) => ({
      id: rowId(), name: c.name, kind: c.kind, belt: c.belt ?? '', pulleyBasis: c.outsideMm !== undefined ? 'outside' as const : 'effective' as const,
      pulleyMm: toUnit(c.pulleyMm, unit), outsideMm: toUnit(c.outsideMm, unit), backside: Boolean(c.backside),
      fixedRatio: text(c.fixedRatio), overrunning: Boolean(c.overrunning), designation: c.bearing?.designation ?? '',
      balls: text(c.bearing?.balls), ballMm: text(c.bearing?.ballMm), pitchMm: text(c.bearing?.pitchMm),
      contactDeg: text(c.bearing?.contactDeg), ftf: text(c.bearing?.factors?.ftf), bpfo: text(c.bearing?.factors?.bpfo),
      bpfi: text(c.bearing?.factors?.bpfi), bsf: text(c.bearing?.factors?.bsf), rotatingRing: c.bearing?.rotatingRing ?? '',
      source: c.bearing?.source ?? '',
    })),
  };
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** The document a draft stands for and the messages of cells that are not numbers. */
export function draftToDocument(draft: EngineDraft, options: PulleyOptions = DEFAULT_PULLEY_OPTIONS): { doc: DriveDocument & { notes?: string }; errors: FieldErrors } {
  const errors: FieldErrors = {};
  const mm = (v: number | undefined): number | undefined => (v === undefined ? undefined : fromUnit(v, options.unit));
  const num = (raw: string, path: string): number | undefined => {
    const v = raw.trim().replace(',', '.');
    if (v === '') return undefined;
    if (!NUMBER.test(v)) {
      errors[path] = 'Enter a number';
      return undefined;
    }
    return Number(v);
  };
  const firing = draft.firingOrder.split(/[\s,;-]+/).filter(Boolean);
  const firingOrder = firing.map(Number);
  if (firing.some((f) => !/^\d+$/.test(f))) errors.firingOrder = 'Write cylinder numbers separated by dashes, e.g. 1-3-4-2';
  const doc: DriveDocument & { notes?: string } = {
    name: draft.name,
    cylinders: num(draft.cylinders, 'cylinders') ?? Number.NaN,
    firingOrder,
    belts: draft.belts.map((b, i) => ({
      name: b.name, lengthMm: num(b.lengthMm, `belts[${i}].lengthMm`) ?? Number.NaN, driver: b.driver,
      driverPulleyMm: mm(num(b.driverPulleyMm, `belts[${i}].driverPulleyMm`)) ?? Number.NaN,
    })),
    components: draft.components.map((c, i): ComponentSpec => {
      const at = `components[${i}]`;
      const out: ComponentSpec = { name: c.name, kind: c.kind };
      if (c.belt) out.belt = c.belt;
      // The table shows one of the two: a pulley for a belt-driven part, a fixed ratio otherwise.
      if (c.belt && c.pulleyBasis === 'outside') {
        // Measured across the rib tips (or the flat of a backside pulley): effective = outside + the shop's offset.
        const outside = mm(num(c.outsideMm, `${at}.outsideMm`));
        if (outside !== undefined && outside > 0) {
          out.outsideMm = outside;
          out.pulleyMm = effectiveFromOutside(outside, c.backside, options);
        } else if (outside === undefined && !errors[`${at}.outsideMm`]) errors[`${at}.outsideMm`] = 'Enter the measured outside diameter';
      } else {
        const pulleyMm = c.belt ? mm(num(c.pulleyMm, `${at}.pulleyMm`)) : undefined;
        if (pulleyMm !== undefined) out.pulleyMm = pulleyMm;
      }
      if (c.backside) out.backside = true;
      const fixedRatio = c.belt ? undefined : num(c.fixedRatio, `${at}.fixedRatio`);
      if (fixedRatio !== undefined) out.fixedRatio = fixedRatio;
      if (c.overrunning) out.overrunning = true;
      const b: BearingSpec = {};
      if (c.designation.trim()) b.designation = c.designation.trim();
      const geometry = { balls: num(c.balls, `${at}.bearing.balls`), ballMm: num(c.ballMm, `${at}.bearing.ballMm`),
        pitchMm: num(c.pitchMm, `${at}.bearing.pitchMm`), contactDeg: num(c.contactDeg, `${at}.bearing.contactDeg`) };
      for (const [k, v] of Object.entries(geometry)) if (v !== undefined) (b as Record<string, number>)[k] = v;
      const f = { ftf: num(c.ftf, `${at}.bearing.factors.ftf`), bpfo: num(c.bpfo, `${at}.bearing.factors.bpfo`),
        bpfi: num(c.bpfi, `${at}.bearing.factors.bpfi`), bsf: num(c.bsf, `${at}.bearing.factors.bsf`) };
      const given = Object.values(f).filter((v) => v !== undefined).length;
      if (given === 4) b.factors = { ftf: f.ftf!, bpfo: f.bpfo!, bpfi: f.bpfi!, bsf: f.bsf! };
      else if (given > 0) errors[`${at}.bearing.factors`] = 'Give all four factors (FTF, BPFO, BPFI, BSF) or none';
      if (c.rotatingRing) b.rotatingRing = c.rotatingRing;
      if (c.source) b.source = c.source;
      if (Object.keys(b).length > 0) out.bearing = b;
      return out;
    }),
  };
  const idle = num(draft.idleRpm, 'idleRpm');
  if (idle !== undefined) doc.idleRpm = idle;
  if (draft.notes.trim()) doc.notes = draft.notes.trim();
  return { doc, errors };
}

/**
 * Checks a draft as the server will: cell numbers first, then the drive schema. Returns the
 * document when it is valid, and every message keyed by JSON path.
 */
export function checkDraft(draft: EngineDraft, options: PulleyOptions = DEFAULT_PULLEY_OPTIONS): { doc: DriveDocument & { notes?: string } | null; errors: FieldErrors } {
  const { doc, errors } = draftToDocument(draft, options);
  try {
    const parsed = parseDriveDocument(doc);
    if (Object.keys(errors).length > 0) return { doc: null, errors };
    return { doc: { ...parsed, ...(doc.notes ? { notes: doc.notes } : {}) }, errors };
  } catch (error) {
    if (!(error instanceof DriveDocumentError)) throw error;
    for (const issue of error.issues) {
      // A NaN we put in for an unreadable number already has its message.
      if (!(issue.path in errors)) errors[issue.path] = issue.message;
    }
    return { doc: null, errors };
  }
}

/** Server `details` (a list of `{ path, message }`) as messages keyed by path. */
export function errorsFromDetails(details: unknown): FieldErrors {
  const out: FieldErrors = {};
  if (Array.isArray(details)) {
    for (const d of details) {
      if (d && typeof d === 'object' && typeof (d as { path?: unknown }).path === 'string' && typeof (d as { message?: unknown }).message === 'string') {
        const { path, message } = d as { path: string; message: string };
        out[path] ??= message;
      }
    }
  }
  return out;
}

/** Messages under a prefix, e.g. every message of `components[2]` (for the row's marker). */
export function errorsUnder(errors: FieldErrors, prefix: string): string[] {
  return Object.entries(errors).filter(([k]) => k === prefix || k.startsWith(`${prefix}.`) || k.startsWith(`${prefix}[`)).map(([, v]) => v);
}

/**
 * The form field a JSON path of the drive document belongs to: `components[2].bearing.ballMm` →
 * `components.2.ballMm`, `components[2].bearing.factors.ftf` → `components.2.ftf`, a row-level
 * problem (`components[2]`) → its belt cell, the whole list (`components`) → the first row's name.
 */
export function formPathOf(jsonPath: string, draft?: EngineDraft): string {
  const m = /^(components|belts)\[(\d+)\](?:\.(.+))?$/.exec(jsonPath);
  if (m) {
    const [, list, i, rest] = m;
    if (list === 'belts') return `belts.${i}.${rest ?? 'name'}`;
    if (!rest) return `components.${i}.belt`;
    if (rest === 'bearing' || rest === 'bearing.factors') return `components.${i}.${rest === 'bearing' ? 'designation' : 'ftf'}`;
    const leaf = rest.split('.').pop()!;
    if (leaf === 'pulleyMm' && draft?.components[Number(i)]?.pulleyBasis === 'outside') return `components.${i}.outsideMm`;
    if (leaf === 'pulleyMm' && draft && !draft.components[Number(i)]?.belt) return `components.${i}.fixedRatio`;
    return `components.${i}.${leaf}`;
  }
  if (jsonPath === 'components') return 'components.0.name';
  if (jsonPath === 'belts') return 'belts.0.name';
  if (jsonPath === '$') return 'name';
  return jsonPath.split('.')[0];
}
