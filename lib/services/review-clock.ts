import 'server-only';
import type { Knex } from 'knex';
import { brandCalendar, CLOCK_STAGES as CLOCK_STAGE_LIST, clockEventsFor, reviewDaysFor, reviewStartedAt, transactionNow } from '@/lib/db/review';
import type { ClaimRecord } from '@/lib/db/claims';
import { reviewDeadline, reviewRuleText, storedDueOn, type ClockEvent } from '@/lib/review';
import type { ClockResult } from '@/lib/calendar';

/**
 * The review due date to store with a step, computed inside its transaction: the clock started
 * at `startedAt`, read at the transaction's own time, with the log so far plus the step being written
 * (`pending`, logged after the claim's columns).
 */
export async function dueOnWith(trx: Knex, claim: ClaimRecord, startedAt: string, pending: ClockEvent['event'] | null): Promise<string | null> {
  // One connection: one query at a time.
  const cal = await brandCalendar(claim.brandId, trx);
  const reviewDays = await reviewDaysFor(claim.brandId, claim.partCategory, trx);
  const events = await clockEventsFor([claim.id], trx);
  const now = await transactionNow(trx);
  const log = [...(events.get(claim.id) ?? []), ...(pending ? [{ event: pending, at: now }] : [])];
  const clock = reviewDeadline({ startedAt, now, timeZone: cal.timeZone, calendar: { holidays: cal.holidays }, reviewDays, events: log });
  return storedDueOn(clock);
}

export async function startedAtOf(trx: Knex, claimId: string): Promise<string | null> {
  const row = await trx('claims').where({ id: claimId }).first('review_started_at');
  return row?.review_started_at ? new Date(row.review_started_at).toISOString() : null;
}

/** Columns a submission writes: the review clock starts now, with its due date. */
export async function reviewColumnsOnSubmit(trx: Knex, claim: ClaimRecord): Promise<Record<string, unknown>> {
  const now = await transactionNow(trx);
  return { review_started_at: trx.fn.now(), review_due_on: await dueOnWith(trx, claim, now, null) };
}


const CLOCK_STAGES = new Set<string>(CLOCK_STAGE_LIST);

export type ReviewClockView = { clock: ClockResult; rule: string; reviewDays: number | null };

/** The review clock as of now, for showing: null once the claim is decided, withdrawn or still a draft. */
export async function reviewClockFor(claim: Pick<ClaimRecord, 'id' | 'brandId' | 'partCategory' | 'stage'>, now = new Date()): Promise<ReviewClockView | null> {
  if (!CLOCK_STAGES.has(claim.stage)) return null;
  const [started, cal, reviewDays, events] = await Promise.all([
    reviewStartedAt(claim.id),
    brandCalendar(claim.brandId),
    reviewDaysFor(claim.brandId, claim.partCategory),
    clockEventsFor([claim.id]),
  ]);
  if (!started) return null;
  const calendar = { holidays: cal.holidays };
  // A server clock a moment behind the database's must not read as "before the clock started".
  const at = new Date(Math.max(now.getTime(), started.getTime())).toISOString();
  const clock = reviewDeadline({ startedAt: started.toISOString(), now: at, timeZone: cal.timeZone, calendar, reviewDays, events: events.get(claim.id) ?? [] });
  return { clock, rule: reviewRuleText(calendar), reviewDays };
}
