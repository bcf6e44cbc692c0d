import { addBusinessDays as dfAddBusinessDays, format, getISODay } from 'date-fns';
import { describe, expect, it } from 'vitest';
import { coreClock, coreClockAction } from '@/lib/fulfilment';

// The demo brand's 2026 calendar (invented company, real public-holiday dates of the Netherlands for
// 2026: Good Friday 3 Apr, Easter Monday 6 Apr, King's Day 27 Apr, Liberation Day 5 May; from memory).
const CAL = { holidays: ['2026-04-03', '2026-04-06', '2026-04-27', '2026-05-05', '2026-05-14', '2026-05-25'] };
const TZ = 'Europe/Amsterdam';
const POLICY = { returnDays: 15, graceDays: 5 };
const clockAt = (deliveredAt: string, now: string, calendar = CAL) => coreClock({ deliveredAt, now, timeZone: TZ, calendar, policy: POLICY });

describe('core due date: business days after the delivery day, in the brand’s calendar and time zone', () => {
  it('delivered Thu 2 Apr 2026: 15 business days skip Easter and King’s Day → due Tue 28 Apr; 5 days of grace skip Liberation Day → 6 May (counted by hand)', () => {
    expect(getISODay(new Date(2026, 3, 2))).toBe(4); // a Thursday (date-fns)
    // Counted on the calendar: 3 Apr holiday, 4–5 weekend, 6 holiday; 7–10 (1–4), 13–17 (5–9), 20–24 (10–14),
    // 27 holiday, 28 Apr = 15. Grace: 29, 30 Apr, 1 May, 4 May, (5 May holiday), 6 May = 5.
    const c = clockAt('2026-04-02T11:00:00Z', '2026-04-10T09:00:00Z');
    expect(c.dueDate).toBe('2026-04-28');
    expect(c.graceEndsDate).toBe('2026-05-06');
    expect(c.status).toBe('on_track');
  });

  it('without holidays it agrees with date-fns addBusinessDays (weekends only), for every start in a year', () => {
    for (let d = new Date(Date.UTC(2026, 0, 1)); d.getUTCFullYear() === 2026; d = new Date(d.getTime() + 86_400_000)) {
      const day = d.toISOString().slice(0, 10);
      const local = new Date(Number(day.slice(0, 4)), Number(day.slice(5, 7)) - 1, Number(day.slice(8, 10)));
      const c = clockAt(`${day}T10:00:00Z`, `${day}T12:00:00Z`, { holidays: [] });
      expect(c.dueDate, day).toBe(format(dfAddBusinessDays(local, 15), 'yyyy-MM-dd'));
    }
  });

  it('the delivery day is the brand’s local day: 22:30 UTC on 1 Apr is already 2 Apr in Amsterdam', () => {
    expect(clockAt('2026-04-01T22:30:00Z', '2026-04-10T09:00:00Z').dueDate).toBe('2026-04-28');
    expect(coreClock({ deliveredAt: '2026-04-01T22:30:00Z', now: '2026-04-10T09:00:00Z', timeZone: 'UTC', calendar: CAL, policy: POLICY }).dueDate).toBe('2026-04-24');
  });
});

describe('what the clock job does', () => {
  const none = { remindersSent: 0, lastReminderAt: null };
  const at = (now: string, core: { remindersSent: number; lastReminderAt: string | null } = none) => coreClockAction(clockAt('2026-04-02T11:00:00Z', now), core, TZ);

  it('nothing up to and on the due day', () => {
    expect(at('2026-04-27T15:00:00Z')).toBe('none');
    expect(clockAt('2026-04-02T11:00:00Z', '2026-04-28T15:00:00Z').status).toBe('due_soon');
    expect(at('2026-04-28T20:00:00Z')).toBe('none');
  });

  it('the first business day after the due date: remind, once', () => {
    expect(clockAt('2026-04-02T11:00:00Z', '2026-04-29T08:00:00Z').status).toBe('reminder_due');
    expect(at('2026-04-29T08:00:00Z')).toBe('remind');
    expect(at('2026-04-30T08:00:00Z', { remindersSent: 1, lastReminderAt: '2026-04-29T08:00:00Z' })).toBe('none');
  });

  it('still in grace on its last day (6 May, after the 5 May holiday): no write-off yet', () => {
    expect(at('2026-05-06T20:00:00Z', { remindersSent: 1, lastReminderAt: '2026-04-29T08:00:00Z' })).toBe('none');
  });

  it('the day after grace: written off, when the reminder went out on an earlier day', () => {
    expect(clockAt('2026-04-02T11:00:00Z', '2026-05-07T08:00:00Z').status).toBe('chargeback_due');
    expect(at('2026-05-07T08:00:00Z', { remindersSent: 1, lastReminderAt: '2026-04-29T08:00:00Z' })).toBe('write_off');
  });

  it('a job that was down all through grace reminds first, and writes off on a later day', () => {
    expect(at('2026-05-07T08:00:00Z')).toBe('remind');
    expect(at('2026-05-07T16:00:00Z', { remindersSent: 1, lastReminderAt: '2026-05-07T08:00:00Z' })).toBe('none');
    expect(at('2026-05-08T08:00:00Z', { remindersSent: 1, lastReminderAt: '2026-05-07T08:00:00Z' })).toBe('write_off');
  });
});
