/**
 * The append-only timeline of a case (issue 15 item 1): who did what and when. Entries are only
 * ever inserted, inside the transaction of the change they record, so a change and its entry
 * commit together or not at all.
 */
import type { Transaction } from 'sequelize';
import type { TimelineKind } from '../../shared/schemas/cases';
import { CaseEvent } from '../models/case-event';

/** What an entry says. `actorId` null = the system (an analysis finishing). */
export interface TimelineEntryInput {
  shopId: number;
  caseId: number;
  actorId: number | null;
  kind: TimelineKind;
  message: string;
  note?: string | null;
  data?: Record<string, unknown>;
}

/** Appends one entry (in `transaction` when given). */
export async function appendTimeline(entry: TimelineEntryInput, transaction?: Transaction): Promise<CaseEvent> {
  return CaseEvent.create({
    shopId: entry.shopId, caseId: entry.caseId, actorId: entry.actorId, kind: entry.kind, message: entry.message,
    note: entry.note ? entry.note : null, data: entry.data ?? {},
  }, { transaction });
}
