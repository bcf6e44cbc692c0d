import { coreReturnClock, localDate, type BusinessCalendar, type ClockResult } from '@/lib/calendar';

export interface CorePolicy {
  /** Business days after delivery of the replacement (warranty_policies.core_return_days). */
  returnDays: number;
  /** Business days after the due date before the core is written off (core_grace_days). */
  graceDays: number;
}

/** The core-return clock: business days from the replacement's delivery, in the brand's calendar. */
export function coreClock(i: { deliveredAt: string; now: string; timeZone: string; calendar: BusinessCalendar; policy: CorePolicy }): ClockResult {
  return coreReturnClock({
    startedAt: i.deliveredAt,
    now: i.now,
    timeZone: i.timeZone,
    calendar: i.calendar,
    allowanceBusinessDays: i.policy.returnDays,
    graceBusinessDays: i.policy.graceDays,
  });
}

export type CoreClockAction = 'none' | 'remind' | 'write_off';

/**
 * What the clock job does for a core still not sent back: remind the dealer once the due date has
 * passed; write the core off once the grace period has ended, and only when the reminder went out
 * on an earlier day than today (a late reminder still gives the dealer a day's notice).
 */
export function coreClockAction(clock: ClockResult, core: { remindersSent: number; lastReminderAt: string | null }, timeZone: string): CoreClockAction {
  if (clock.status !== 'reminder_due' && clock.status !== 'chargeback_due') return 'none';
  if (core.remindersSent === 0 || core.lastReminderAt === null) return 'remind';
  if (clock.status === 'chargeback_due' && localDate(core.lastReminderAt, timeZone) < clock.today) return 'write_off';
  return 'none';
}
