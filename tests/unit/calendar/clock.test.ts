import { describe, expect, it } from 'vitest';
import { computeClock, coreReturnClock, PAUSE_RULE_TEXT, reviewClock, type BusinessCalendar } from '@/lib/calendar';

// Hand-worked calendars. March 2026: Mon 2, 9, 16, 23, 30. The invented brand is closed
// Fri 2026-04-03 and Mon 2026-04-06; its time zone is Europe/Berlin (UTC+1 until 2026-03-29).
const calendar: BusinessCalendar = { holidays: ['2026-04-03', '2026-04-06'] };
const base = { calendar, timeZone: 'Europe/Berlin' };

describe('review clock (business days, ISDA Following, start day not counted)', () => {
  const submitted = { ...base, startedAt: '2026-03-27T16:00:00Z', allowanceBusinessDays: 5 };

  it('5 business days from Fri 2026-03-27 are due Tue 2026-04-07 (30, 31, 1, 2, then 3–6 off, 7)', () => {
    const c = reviewClock({ ...submitted, now: '2026-03-31T08:00:00Z' });
    expect(c.startDate).toBe('2026-03-27');
    expect(c.dueDate).toBe('2026-04-07');
    expect(c.businessDaysLeft).toBe(3); // Apr 1, 2, 7
    expect(c.businessDaysElapsed).toBe(2); // Mar 30, 31
    expect(c.status).toBe('on_track');
    expect(c.summary).toBe('Due Tuesday 2026-04-07: 3 business days left.');
  });

  it('turns due soon at 2 days or fewer, is due on the due day, and overdue the next business day', () => {
    expect(reviewClock({ ...submitted, now: '2026-04-01T08:00:00Z' }).status).toBe('due_soon'); // 2 left
    const thu = reviewClock({ ...submitted, now: '2026-04-02T08:00:00Z' });
    expect([thu.businessDaysLeft, thu.status]).toEqual([1, 'due_soon']);
    const sat = reviewClock({ ...submitted, now: '2026-04-04T08:00:00Z' });
    expect([sat.businessDaysLeft, sat.status]).toEqual([1, 'due_soon']);
    const due = reviewClock({ ...submitted, now: '2026-04-07T15:00:00Z' });
    expect([due.businessDaysLeft, due.status, due.summary]).toEqual([0, 'due_soon', 'Due today, Tuesday 2026-04-07.']);
    const late = reviewClock({ ...submitted, now: '2026-04-09T08:00:00Z' });
    expect([late.businessDaysLeft, late.status]).toEqual([-2, 'overdue']);
    expect(late.summary).toBe('Overdue by 2 business days (was due Tuesday 2026-04-07).');
    expect(reviewClock({ ...submitted, now: '2026-04-01T08:00:00Z', dueSoonWithinBusinessDays: 1 }).status).toBe('on_track');
  });

  it('takes the start day in the brand time zone, not UTC', () => {
    // 2026-03-26T23:30Z is Thursday in UTC but Friday 00:30 in Berlin: day 1 is Monday 2026-03-30.
    const c = reviewClock({ ...base, startedAt: '2026-03-26T23:30:00Z', allowanceBusinessDays: 5, now: '2026-03-27T09:00:00Z' });
    expect(c.startDate).toBe('2026-03-27');
    expect(c.dueDate).toBe('2026-04-07');
    const utc = reviewClock({ ...base, timeZone: 'UTC', startedAt: '2026-03-26T23:30:00Z', allowanceBusinessDays: 5, now: '2026-03-27T09:00:00Z' });
    expect(utc.dueDate).toBe('2026-04-02');
  });

  it('a 10-day deadline counted from Fri 2026-03-20 would land on the closed Friday 04-03 in calendar weeks; it is due Tue 04-07', () => {
    const c = reviewClock({ ...base, startedAt: '2026-03-20T10:00:00Z', allowanceBusinessDays: 10, now: '2026-03-23T10:00:00Z' });
    expect(c.dueDate).toBe('2026-04-07');
  });
});

describe('pauses while waiting on the dealer (a day is paused when still waiting at its end)', () => {
  // Submitted Monday 2026-03-02; 5 business days without pauses: 3, 4, 5, 6, 9 → due Mon 2026-03-09.
  const claim = { ...base, startedAt: '2026-03-02T09:00:00+01:00', allowanceBusinessDays: 5, now: '2026-03-03T09:00:00+01:00' };

  it('no pause: due Mon 2026-03-09', () => {
    expect(reviewClock(claim).dueDate).toBe('2026-03-09');
  });

  it('Wed 10:00 → Fri 15:00 pauses Wed and Thu: due Wed 2026-03-11', () => {
    const c = reviewClock({ ...claim, now: '2026-03-06T16:00:00+01:00', pauses: [{ from: '2026-03-04T10:00:00+01:00', to: '2026-03-06T15:00:00+01:00' }] });
    expect(c.pausedBusinessDays).toBe(2);
    expect(c.dueDate).toBe('2026-03-11'); // counted: 3, 6, 9, 10, 11
    expect(c.isPaused).toBe(false);
    expect(c.businessDaysLeft).toBe(3);
    expect(c.businessDaysElapsed).toBe(2); // 3 and 6
    expect(c.summary).toContain('Waiting on the dealer added 2 business days.');
  });

  it('a pause that starts and ends on the same local day adds nothing', () => {
    const c = reviewClock({ ...claim, pauses: [{ from: '2026-03-04T10:00:00+01:00', to: '2026-03-04T16:00:00+01:00' }], now: '2026-03-05T09:00:00+01:00' });
    expect(c.pausedBusinessDays).toBe(0);
    expect(c.dueDate).toBe('2026-03-09');
    expect(PAUSE_RULE_TEXT).toMatch(/answered the same day adds nothing/);
  });

  it('a pause ending 00:30 local time the next day pauses the first day only (local midnight, not UTC)', () => {
    // 2026-03-04T23:30Z is Thursday 00:30 in Berlin; in UTC it is still Wednesday.
    const pauses = [{ from: '2026-03-04T10:00:00+01:00', to: '2026-03-04T23:30:00Z' }];
    expect(reviewClock({ ...claim, pauses, now: '2026-03-05T09:00:00+01:00' }).pausedBusinessDays).toBe(1);
    expect(reviewClock({ ...claim, timeZone: 'UTC', pauses, now: '2026-03-05T09:00:00+01:00' }).pausedBusinessDays).toBe(0);
  });

  it('a pause over a weekend counts only its business days (Fri 14:00 → Mon 11:00 pauses Fri)', () => {
    const c = reviewClock({ ...claim, pauses: [{ from: '2026-03-06T14:00:00+01:00', to: '2026-03-09T11:00:00+01:00' }], now: '2026-03-09T12:00:00+01:00' });
    expect(c.pausedBusinessDays).toBe(1);
    expect(c.dueDate).toBe('2026-03-10'); // counted: 3, 4, 5, 9, 10
  });

  it('overlapping pauses count each day once', () => {
    const c = reviewClock({
      ...claim,
      now: '2026-03-06T16:00:00+01:00',
      pauses: [
        { from: '2026-03-04T10:00:00+01:00', to: '2026-03-06T15:00:00+01:00' },
        { from: '2026-03-05T09:00:00+01:00', to: '2026-03-06T08:00:00+01:00' },
      ],
    });
    expect(c.pausedBusinessDays).toBe(2);
  });

  it('an open pause shows paused, with the due date if the clock restarted today', () => {
    const c = reviewClock({ ...claim, now: '2026-03-06T12:00:00+01:00', pauses: [{ from: '2026-03-04T10:00:00+01:00', to: null }] });
    expect(c.isPaused).toBe(true);
    expect(c.status).toBe('paused');
    expect(c.pausedBusinessDays).toBe(2); // Wed, Thu; today (Fri) still counts
    expect(c.dueDate).toBe('2026-03-11');
    expect(c.businessDaysLeft).toBe(3);
    expect(c.summary).toBe('Paused, waiting on the dealer; if it restarts today, due Wednesday 2026-03-11 (3 business days left). Waiting on the dealer added 2 business days.');
  });

  it('a pause with an end after now is read as still running; one starting after now is ignored', () => {
    const c = reviewClock({ ...claim, now: '2026-03-05T12:00:00+01:00', pauses: [{ from: '2026-03-04T10:00:00+01:00', to: '2026-03-10T10:00:00+01:00' }, { from: '2026-03-06T10:00:00+01:00', to: null }] });
    expect(c.isPaused).toBe(true);
    expect(c.pausedBusinessDays).toBe(1);
  });

  it('a pause does not hide an overdue clock', () => {
    const c = reviewClock({ ...claim, now: '2026-03-12T12:00:00+01:00', pauses: [{ from: '2026-03-04T10:00:00+01:00', to: '2026-03-06T15:00:00+01:00' }, { from: '2026-03-12T09:00:00+01:00', to: null }] });
    expect(c.dueDate).toBe('2026-03-11');
    expect(c.status).toBe('overdue');
    expect(c.isPaused).toBe(true);
  });

  it('refuses bad pauses and names the entry', () => {
    expect(() => reviewClock({ ...claim, pauses: [{ from: '2026-03-01T10:00:00+01:00', to: null }] })).toThrow(/pauses\[0\]\.from: .* is before the clock started/);
    expect(() => reviewClock({ ...claim, pauses: [{ from: '2026-03-04T10:00:00+01:00', to: '2026-03-03T10:00:00+01:00' }] })).toThrow(/pauses\[0\]\.to: .* is before the pause's start/);
    expect(() => reviewClock({ ...claim, pauses: [{ from: '2026-03-04 10:00', to: null }] })).toThrow(/pauses\[0\]\.from: '2026-03-04 10:00' is not an ISO timestamp/);
  });
});

describe('core-return clock (from delivery of the replacement, with grace)', () => {
  // Delivered Mon 2026-03-02; 10 business days → due Mon 2026-03-16; grace 5 → last grace day Mon 2026-03-23.
  const core = { ...base, startedAt: '2026-03-02T12:00:00Z', allowanceBusinessDays: 10, graceBusinessDays: 5 };

  it('is due soon, then a reminder is due after the due date, then a chargeback after grace', () => {
    const early = coreReturnClock({ ...core, now: '2026-03-05T12:00:00Z' });
    expect([early.dueDate, early.graceEndsDate, early.status]).toEqual(['2026-03-16', '2026-03-23', 'on_track']);
    expect(coreReturnClock({ ...core, now: '2026-03-12T12:00:00Z' }).status).toBe('due_soon');
    expect(coreReturnClock({ ...core, now: '2026-03-16T12:00:00Z' }).status).toBe('due_soon');
    const remind = coreReturnClock({ ...core, now: '2026-03-17T12:00:00Z' });
    expect([remind.status, remind.businessDaysLeft]).toEqual(['reminder_due', -1]);
    expect(remind.summary).toBe('Overdue by 1 business day (due Monday 2026-03-16); grace ends Monday 2026-03-23: remind the dealer.');
    expect(coreReturnClock({ ...core, now: '2026-03-23T20:00:00Z' }).status).toBe('reminder_due');
    const charge = coreReturnClock({ ...core, now: '2026-03-24T08:00:00Z' });
    expect(charge.status).toBe('chargeback_due');
    expect(charge.summary).toBe('Not returned by the end of grace on Monday 2026-03-23: chargeback due.');
  });

  it('without grace a chargeback is due the day after the due date', () => {
    const c = computeClock({ ...core, kind: 'core_return', graceBusinessDays: 0, now: '2026-03-17T08:00:00Z' });
    expect(c.status).toBe('chargeback_due');
  });
});

describe('clock input checks', () => {
  const ok = { ...base, startedAt: '2026-03-02T09:00:00Z', now: '2026-03-03T09:00:00Z', allowanceBusinessDays: 5 };
  it('names what is wrong', () => {
    expect(() => reviewClock({ ...ok, now: '2026-03-01T09:00:00Z' })).toThrow(/now: .* is before the clock started/);
    expect(() => reviewClock({ ...ok, allowanceBusinessDays: 0 })).toThrow(/allowanceBusinessDays: expected a whole number of business days ≥ 1, got 0/);
    expect(() => reviewClock({ ...ok, timeZone: 'Mars/Olympus' })).toThrow(/timeZone: 'Mars\/Olympus'/);
    expect(() => computeClock({ ...ok, graceBusinessDays: 3 })).toThrow(/graceBusinessDays: a grace period applies to the core-return clock only/);
    expect(() => reviewClock({ ...ok, calendar: { holidays: ['Easter'] } })).toThrow(/calendar\.holidays\[0\]/);
  });
});
