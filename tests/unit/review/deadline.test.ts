// Review deadlines against hand-worked calendars. Convention: business days with the start day not
// counted, and ISDA 2006 §4.12 "Following" for a deadline on a day off (lib/calendar DEADLINE_CONVENTION).
// December 2026: Mon 21, Mon 28; the invented brand is closed 24, 25 and 31 December and 1 January.
import { describe, expect, it } from 'vitest';
import { adjustDeadline } from '@/lib/calendar';
import { DEFAULT_REVIEW_DAYS, REVIEW_CONVENTION, reviewDeadline, reviewRuleText, storedDueOn, waitingPauses, type ClockEvent } from '@/lib/review';

const brand = { timeZone: 'Europe/Amsterdam', calendar: { holidays: ['2026-12-24', '2026-12-25', '2026-12-31', '2027-01-01'] } };
const submitted = '2026-12-21T09:00:00Z'; // Monday 10:00 in Amsterdam
const submit: ClockEvent = { event: 'SUBMIT', at: submitted };

describe('review deadline (5 business days, start day not counted, ISDA Following)', () => {
  it('uses the Following convention of the 2006 ISDA Definitions §4.12 and says so', () => {
    expect(REVIEW_CONVENTION).toBe('following');
    expect(reviewRuleText(brand.calendar)).toMatch(/ISDA 'Following'/);
    // A deadline on the closed Thursday 24 December moves to the next business day, Monday 28.
    expect(adjustDeadline('2026-12-24', brand.calendar)).toBe('2026-12-28');
  });

  it('Mon 21 Dec: 22, 23, (24–27 closed), 28, 29, 30 → due Wed 2026-12-30', () => {
    const c = reviewDeadline({ ...brand, startedAt: submitted, now: '2026-12-22T08:00:00Z', reviewDays: 5, events: [submit] });
    expect(c.dueDate).toBe('2026-12-30');
    expect(c.businessDaysLeft).toBe(4); // 23, 28, 29, 30
    expect(c.status).toBe('on_track');
    expect(storedDueOn(c)).toBe('2026-12-30');
  });

  it('turns overdue on the first business day after the due date, across the closed New Year days', () => {
    const due = reviewDeadline({ ...brand, startedAt: submitted, now: '2026-12-30T16:00:00Z', reviewDays: 5, events: [submit] });
    expect([due.businessDaysLeft, due.status]).toEqual([0, 'due_soon']);
    // 31 Dec and 1 Jan are closed, 2–3 Jan a weekend: on Mon 4 Jan the claim is 1 business day late (the 30th is the one missed).
    const late = reviewDeadline({ ...brand, startedAt: submitted, now: '2027-01-04T09:00:00Z', reviewDays: 5, events: [submit] });
    expect([late.businessDaysLeft, late.status]).toEqual([-1, 'overdue']);
    const notYet = reviewDeadline({ ...brand, startedAt: submitted, now: '2027-01-01T09:00:00Z', reviewDays: 5, events: [submit] });
    // 1 Jan is after the due date even though it is a day off; counted back, the business days missed are the 30th only.
    expect([notYet.businessDaysLeft, notYet.status]).toEqual([-1, 'overdue']);
  });

  it('a wait on the dealer from Tue 22 15:00 to Mon 28 11:00 pauses 22 and 23: due Tue 2027-01-05', () => {
    const events: ClockEvent[] = [submit, { event: 'REQUEST_INFO', at: '2026-12-22T14:00:00Z' }, { event: 'RESUBMIT', at: '2026-12-28T10:00:00Z' }];
    const c = reviewDeadline({ ...brand, startedAt: submitted, now: '2026-12-28T12:00:00Z', reviewDays: 5, events });
    // Counted: 28, 29, 30, (31, 1 closed; 2, 3 weekend) 4, 5.
    expect(c.pausedBusinessDays).toBe(2);
    expect(c.dueDate).toBe('2027-01-05');
    expect(c.isPaused).toBe(false);
    expect(storedDueOn(c)).toBe('2027-01-05');
  });

  it('while still waiting the clock is paused; the stored due date is empty, the shown one is "if it restarted today"', () => {
    const events: ClockEvent[] = [submit, { event: 'REQUEST_INFO', at: '2026-12-22T14:00:00Z' }];
    const c = reviewDeadline({ ...brand, startedAt: submitted, now: '2026-12-23T12:00:00Z', reviewDays: 5, events });
    expect(c.isPaused).toBe(true);
    expect(c.status).toBe('paused');
    expect(c.pausedBusinessDays).toBe(1); // Tue 22; today (23) still counts
    expect(c.dueDate).toBe('2027-01-04'); // 23, 28, 29, 30, (31, 1 closed; 2, 3 weekend) 4
    expect(storedDueOn(c)).toBeNull();
  });

  it('a question answered the same day adds nothing', () => {
    const events: ClockEvent[] = [submit, { event: 'REQUEST_INFO', at: '2026-12-22T08:00:00Z' }, { event: 'RESUBMIT', at: '2026-12-22T15:00:00Z' }];
    expect(reviewDeadline({ ...brand, startedAt: submitted, now: '2026-12-22T16:00:00Z', reviewDays: 5, events }).dueDate).toBe('2026-12-30');
  });

  it('takes the start day in the brand’s time zone: Thu 17 Dec 23:30 UTC is Friday in Amsterdam', () => {
    const start = '2026-12-17T23:30:00Z';
    const local = reviewDeadline({ ...brand, startedAt: start, now: '2026-12-18T09:00:00Z', reviewDays: 5, events: [] });
    expect(local.startDate).toBe('2026-12-18');
    expect(local.dueDate).toBe('2026-12-29'); // 21, 22, 23, 28, 29
    const utc = reviewDeadline({ ...brand, timeZone: 'UTC', startedAt: start, now: '2026-12-18T09:00:00Z', reviewDays: 5, events: [] });
    expect(utc.dueDate).toBe('2026-12-28'); // 18, 21, 22, 23, 28
  });

  it('an appeal starts the clock afresh: waits before it do not count', () => {
    const appealedAt = '2027-01-11T10:00:00Z'; // Monday
    const events: ClockEvent[] = [
      submit, { event: 'REQUEST_INFO', at: '2026-12-22T14:00:00Z' }, { event: 'RESUBMIT', at: '2026-12-28T10:00:00Z' },
      { event: 'APPEAL', at: appealedAt },
    ];
    const c = reviewDeadline({ ...brand, startedAt: appealedAt, now: '2027-01-11T12:00:00Z', reviewDays: 5, events });
    expect(c.pausedBusinessDays).toBe(0);
    expect(c.dueDate).toBe('2027-01-18'); // 12, 13, 14, 15, 18
  });

  it('a US brand calendar: 4 business days from Wed 25 Nov 2026 over Thanksgiving are due Thu 3 Dec (America/Denver)', () => {
    const us = { timeZone: 'America/Denver', calendar: { holidays: ['2026-11-26', '2026-11-27'] } };
    const c = reviewDeadline({ ...us, startedAt: '2026-11-26T02:00:00Z', now: '2026-11-30T15:00:00Z', reviewDays: 4, events: [] });
    expect(c.startDate).toBe('2026-11-25'); // 19:00 on Wednesday in Denver
    expect(c.dueDate).toBe('2026-12-03'); // (26, 27 closed; 28, 29 weekend) 30, 1, 2, 3
  });

  it(`falls back to ${DEFAULT_REVIEW_DAYS} business days when the brand has no policy for the part`, () => {
    expect(reviewDeadline({ ...brand, startedAt: submitted, now: submitted, reviewDays: null, events: [] }).dueDate).toBe('2026-12-30');
  });
});

describe('waits on the dealer, recovered from the log', () => {
  it('each request opens a pause, the next resubmission or withdrawal closes it; earlier ones are ignored', () => {
    const events: ClockEvent[] = [
      { event: 'RESUBMIT', at: '2026-12-01T09:00:00Z' },
      { event: 'REQUEST_INFO', at: '2026-12-22T14:00:00Z' },
      { event: 'TAKE', at: '2026-12-22T15:00:00Z' },
      { event: 'RESUBMIT', at: '2026-12-28T10:00:00Z' },
      { event: 'REQUEST_INFO', at: '2026-12-29T10:00:00Z' },
      { event: 'WITHDRAW', at: '2026-12-30T10:00:00Z' },
      { event: 'REQUEST_INFO', at: '2026-12-20T10:00:00Z' }, // before the clock started
    ];
    expect(waitingPauses(events, submitted)).toEqual([
      { from: '2026-12-22T14:00:00Z', to: '2026-12-28T10:00:00Z' },
      { from: '2026-12-29T10:00:00Z', to: '2026-12-30T10:00:00Z' },
    ]);
  });

  it('reads the log in time order and leaves a pause open while the dealer has not answered', () => {
    const events: ClockEvent[] = [{ event: 'RESUBMIT', at: '2026-12-28T10:00:00Z' }, { event: 'REQUEST_INFO', at: '2026-12-22T14:00:00Z' }, { event: 'REQUEST_INFO', at: '2026-12-29T10:00:00Z' }];
    expect(waitingPauses(events, submitted)).toEqual([
      { from: '2026-12-22T14:00:00Z', to: '2026-12-28T10:00:00Z' },
      { from: '2026-12-29T10:00:00Z', to: null },
    ]);
  });
});
