/**
 * A ranking score as a list of named terms (DEVELOPERS.md, "Signal processing in `shared/`"): the pattern's evidence (0–1) times one
 * factor per judgement (engine orders, shaft multiples, sidebands, slip, other bands, rivals that
 * explain the lines better, …). The total and the evidence sentences are both derived from this
 * one list, so a sentence can never say what the score did not do: a term's reason is printed
 * exactly when its factor moved the score (|factor − 1| ≥ `TERM_SHOWN_ABOVE`), and the score is the
 * product of the factors, clamped to 0–1 and rounded to 3 decimals.
 */

/** The judgements a pattern's score is made of. */
export type TermName =
  | 'pattern'
  | 'engine_orders'
  | 'shaft_multiples'
  | 'masked'
  | 'sidebands'
  | 'slip'
  | 'other_bands'
  | 'own_shaft_speed'
  | 'harmonics_of_another'
  | 'family_of_another'
  | 'shaft_confirmed_rival'
  | 'stands_out';

/** One term: its multiplicative factor and, when it moved the score, why (a technician's words). */
export interface ScoreTerm {
  name: TermName;
  factor: number;
  reason: string;
}

/** A factor within this of 1 changed nothing worth a sentence (and rounds away in the score). */
export const TERM_SHOWN_ABOVE = 0.005;

/** Score of a term list: the product of the factors, clamped to 0–1, rounded to 3 decimals. */
export function scoreOf(terms: readonly ScoreTerm[]): number {
  const product = terms.reduce((p, t) => p * t.factor, 1);
  return Math.round(1000 * Math.max(0, Math.min(1, product))) / 1000;
}

/** Whether a term is shown: it moved the score. The base `pattern` term is described by the head sentence instead. */
export function termShown(term: ScoreTerm): boolean {
  return term.name !== 'pattern' && Math.abs(term.factor - 1) >= TERM_SHOWN_ABOVE && term.reason !== '';
}

/** The sentences of the terms that moved the score, each with the factor it applied (e.g. "… (×0.60)"). */
export function termSentences(terms: readonly ScoreTerm[]): string[] {
  return terms.filter(termShown).map((t) => `${t.reason} (×${t.factor.toFixed(2)})`);
}

/** Appends a term (returns the list, for chaining). A factor of exactly 1 is kept too: it says the judgement was made and changed nothing. */
export function addTerm(terms: ScoreTerm[], name: TermName, factor: number, reason: string): ScoreTerm[] {
  terms.push({ name, factor, reason });
  return terms;
}
