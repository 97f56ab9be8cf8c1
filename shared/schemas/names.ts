/**
 * Names people type (engines, belts, parts, designations) as the database stores them: Unicode
 * NFC, no control characters (NUL, BEL, ESC, CR, LF…), no bidirectional overrides or isolates
 * (U+202A–U+202E, U+2066–U+2069, which make a name read differently from what it is), no lone
 * surrogates, and a length checked on the stored form (the normalised text and its lower-cased
 * key, which can be longer: "İ" lower-cases to two code points).
 */
import { z } from 'zod';

// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
const BIDI = /[\u202a-\u202e\u2066-\u2069\u200e\u200f\u061c]/;
const LONE_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

/** Length in code points (MariaDB counts characters of a utf8mb4 VARCHAR this way). */
export const codePoints = (s: string): number => [...s].length;

/**
 * The key two names are compared by: lower case with accents removed, so that names the
 * database's accent- and case-insensitive collation holds equal ("Idler", "ídler") are refused
 * by validation, naming the field, before the unique index would.
 */
export function nameFoldKey(name: string): string {
  return name.normalize('NFD').replace(/\p{M}+/gu, '').normalize('NFC').toLowerCase().replace(/ß/g, 'ss').trim();
}

/** The problem with a name as typed, in the user's words; null when it can be stored. */
export function nameProblem(raw: string, what: string, max: number): string | null {
  if (LONE_SURROGATE.test(raw)) return `${what} contains a broken character; retype it`;
  const s = raw.normalize('NFC').trim();
  if (s === '') return `${what} must not be empty`;
  if (CONTROL.test(s)) return `${what} must not contain control characters such as line breaks or tabs`;
  if (BIDI.test(s)) return `${what} must not contain text-direction marks`;
  if (codePoints(s) > max || codePoints(s.toLowerCase()) > max) return `${what} can be at most ${max} characters`;
  return null;
}

/** A zod string for a name: normalised to NFC and trimmed, refused with `nameProblem`'s message. */
export function nameSchema(what: string, max = 100) {
  return z.string({ error: `${what} must be text` })
    .superRefine((s, ctx) => {
      const problem = nameProblem(s, what, max);
      if (problem) ctx.addIssue({ code: 'custom', message: problem });
    })
    .transform((s) => s.normalize('NFC').trim());
}
