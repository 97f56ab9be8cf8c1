/**
 * Case status moves (DESIGN.md "Case", issue 15 item 1) and the decisions on suspects. Every move
 * locks the case row (SELECT … FOR UPDATE) inside one transaction, checks the move against
 * CASE_MOVES there, and writes the change with its timeline entry, so two users acting at once
 * never both succeed at a move only one may make. Any other move answers 409 `illegal_move`
 * naming the moves allowed from the current status.
 */
import type { Transaction } from 'sequelize';
import { CASE_MOVES, type CaseStatus, type ConfirmCause } from '../../shared/schemas/cases';
import { AppError, notFound } from '../errors';
import type { Logger } from '../logger';
import type { Mailer } from '../mail/mailer';
import type { Case } from '../models/case';
import { Finding } from '../models/finding';
import { User } from '../models/user';
import { rankAndStore, rankBlocker } from './case-ranking';
import { appendTimeline } from './case-timeline';
import { type Actor, lockCase, sequelizeOf } from './cases';

/** What a ranking needs to tell the lead. */
export interface Notifier { mailer: Mailer; publicUrl: string; logger: Logger }

const list = (xs: readonly string[]) => (xs.length === 0 ? 'nowhere' : xs.length === 1 ? xs[0] : `${xs.slice(0, -1).join(', ')} or ${xs[xs.length - 1]}`);
const article = (s: string) => (/^[aeiou]/.test(s) ? 'An' : 'A');

/** 409 `illegal_move` saying which moves are allowed from `from`. */
export function illegalMove(from: CaseStatus, to: CaseStatus): AppError {
  const allowed = CASE_MOVES[from];
  const message = allowed.length === 0
    ? `${article(from)} ${from} case cannot move any more (asked for ${to})`
    : `${article(from)} ${from} case can move to ${list(allowed)}, not to ${to}`;
  return new AppError(409, 'illegal_move', message, { from, to, allowed });
}

function assertMove(c: Case, to: CaseStatus): void {
  if (!CASE_MOVES[c.status].includes(to)) throw illegalMove(c.status, to);
}

async function setStatus(c: Case, to: CaseStatus, t: Transaction): Promise<void> {
  c.status = to;
  c.version += 1;
  await c.save({ transaction: t });
}

async function mailLead(c: Case, notify: Notifier | null, rankedBy: string): Promise<void> {
  if (!notify || c.leadId === null) return;
  const lead = await User.findOne({ where: { id: c.leadId, shopId: c.shopId, active: true } });
  if (!lead) return;
  const top = await Finding.findOne({ where: { caseId: c.id, inRanking: true }, order: [['rank', 'ASC']] });
  const link = `${notify.publicUrl}/cases/${c.id}`;
  const topLine = top ? `Top suspect: ${top.component} (${top.fault.replace('_', ' ')}), score ${top.score.toFixed(2)}.` : 'No part ranks as a suspect.';
  await notify.mailer.send({
    to: lead.email, shopId: c.shopId,
    subject: `Case ${c.roNumber} is ranked and waits for your decision`,
    text: `Hello ${lead.name},\n\n${rankedBy} marked the captures of case ${c.roNumber} complete and Crankwise ranked the suspects.\n${topLine}\n\nReview the evidence and confirm the cause:\n${link}\n`,
  }).catch((error: unknown) => notify.logger.warn('ranking mail failed', { caseId: c.id, error }));
}

/** testing → ranked: the before-repair captures are complete; ranks and tells the lead (one e-mail). */
export async function completeCase(actor: Actor, id: number, notify: Notifier | null): Promise<void> {
  const c = await sequelizeOf().transaction(async (t) => {
    const row = await lockCase(actor.shopId, id, t);
    assertMove(row, 'ranked');
    const blocker = await rankBlocker(row, t);
    if (blocker) throw blocker;
    const { suspects } = await rankAndStore(row, t);
    await setStatus(row, 'ranked', t);
    await appendTimeline({ shopId: actor.shopId, caseId: id, actorId: actor.id, kind: 'ranked', message: `${actor.name} marked the captures complete; ${suspects} suspect${suspects === 1 ? '' : 's'} ranked` }, t);
    return row;
  });
  await mailLead(c, notify, actor.name);
}

/** Re-ranks a ranked or confirmed case with the engine's current drive (no re-analysis). */
export async function rerankCase(actor: Actor, id: number): Promise<void> {
  await sequelizeOf().transaction(async (t) => {
    const c = await lockCase(actor.shopId, id, t);
    if (c.status !== 'ranked' && c.status !== 'confirmed') {
      throw new AppError(409, 'illegal_move', `Only a ranked or confirmed case can be re-ranked; this one is ${c.status}`, { from: c.status, to: c.status, allowed: CASE_MOVES[c.status] });
    }
    if (c.engineId === null) throw new AppError(409, 'engine_required', 'Choose the engine from the Drive library before ranking');
    const { confirmedDropped, suspects } = await rankAndStore(c, t);
    c.version += 1;
    await c.save({ transaction: t });
    await appendTimeline({ shopId: actor.shopId, caseId: id, actorId: actor.id, kind: 're_ranked', message: `${actor.name} re-ranked with the current engine; ${suspects} suspect${suspects === 1 ? '' : 's'}` }, t);
    if (confirmedDropped && c.status === 'confirmed') {
      await reopenWithin(c, t, null, 'The confirmed cause is no longer in the ranking after the re-rank; the case is back in testing');
    }
  });
}

async function reopenWithin(c: Case, t: Transaction, actor: Actor | null, message: string, note = ''): Promise<void> {
  await Finding.update({ status: 'suggested' }, { where: { caseId: c.id, status: 'confirmed' }, transaction: t });
  c.confirmed = null;
  await setStatus(c, 'testing', t);
  await appendTimeline({ shopId: c.shopId, caseId: c.id, actorId: actor?.id ?? null, kind: 'reopened', message, note }, t);
}

/** ranked → confirmed: a suspect (findingId) or a part not in the list, with a note. */
export async function confirmCause(actor: Actor, id: number, body: ConfirmCause): Promise<void> {
  await sequelizeOf().transaction(async (t) => {
    const c = await lockCase(actor.shopId, id, t);
    assertMove(c, 'confirmed');
    let component = body.component ?? '';
    let fault: string | null = body.fault ?? null;
    if (body.findingId !== undefined) {
      const f = await Finding.findOne({ where: { id: body.findingId, caseId: c.id }, transaction: t, lock: t.LOCK.UPDATE });
      if (!f || !f.inRanking) throw new AppError(400, 'validation_failed', 'findingId: choose a suspect of this case\'s ranking', [{ path: 'findingId', message: 'not a suspect of this case' }]);
      await f.update({ status: 'confirmed', decidedById: actor.id, decidedAt: new Date(), note: body.note }, { transaction: t });
      component = f.component;
      fault = f.fault;
    }
    c.confirmed = { component, fault, findingId: body.findingId ?? null, note: body.note, byId: actor.id, at: new Date().toISOString() };
    await setStatus(c, 'confirmed', t);
    const what = fault ? `${component} (${fault.replace('_', ' ')})` : component;
    await appendTimeline({ shopId: actor.shopId, caseId: id, actorId: actor.id, kind: 'confirmed', message: `${actor.name} confirmed ${what} as the cause`, note: body.note, data: { findingId: body.findingId ?? null } }, t);
  });
}

/** ranked/confirmed → testing (lead). */
export async function reopenCase(actor: Actor, id: number, note: string): Promise<void> {
  await sequelizeOf().transaction(async (t) => {
    const c = await lockCase(actor.shopId, id, t);
    if (c.status === 'open') {
      throw new AppError(409, 'illegal_move', 'An open case moves to testing by itself with its first capture; only a ranked or confirmed case can be re-opened', { from: 'open', to: 'testing', allowed: CASE_MOVES.open });
    }
    assertMove(c, 'testing');
    await reopenWithin(c, t, actor, `${actor.name} re-opened the case for more testing`, note);
  });
}

/** confirmed → verified, verified → closed (lead). */
export async function advanceCase(actor: Actor, id: number, to: 'verified' | 'closed', note: string): Promise<void> {
  await sequelizeOf().transaction(async (t) => {
    const c = await lockCase(actor.shopId, id, t);
    assertMove(c, to);
    await setStatus(c, to, t);
    await appendTimeline({ shopId: actor.shopId, caseId: id, actorId: actor.id, kind: to, message: `${actor.name} ${to === 'verified' ? 'verified the repair' : 'closed the case'}`, note }, t);
  });
}

/** Dismisses or restores a suspect with a note (specialist, lead, admin). */
export async function decideFinding(actor: Actor, findingId: number, decision: 'dismissed' | 'suggested', note: string): Promise<Finding> {
  return sequelizeOf().transaction(async (t) => {
    const found = await Finding.findOne({ where: { id: findingId, shopId: actor.shopId }, transaction: t });
    if (!found) throw notFound('Suspect');
    const c = await lockCase(actor.shopId, found.caseId, t);
    const f = (await Finding.findByPk(findingId, { transaction: t, lock: t.LOCK.UPDATE }))!;
    if (c.status !== 'ranked' && c.status !== 'confirmed') {
      throw new AppError(409, 'illegal_move', `Suspects can be dismissed or restored while the case is ranked or confirmed; it is ${c.status}`, { from: c.status, to: c.status, allowed: CASE_MOVES[c.status] });
    }
    if (f.status === 'confirmed') throw new AppError(409, 'finding_confirmed', 'This suspect is the confirmed cause; re-open the case before dismissing it');
    await f.update({ status: decision, decidedById: actor.id, decidedAt: new Date(), note }, { transaction: t });
    const what = `${f.component} ${f.fault.replace('_', ' ')}`;
    await appendTimeline({
      shopId: actor.shopId, caseId: c.id, actorId: actor.id, kind: decision === 'dismissed' ? 'suspect_dismissed' : 'suspect_restored',
      message: `${actor.name} ${decision === 'dismissed' ? 'dismissed' : 'restored'} ${what}`, note, data: { findingId },
    }, t);
    return f;
  });
}
