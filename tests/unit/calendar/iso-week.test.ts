import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { dateFromIsoWeek, fromDayNumber, isoWeek, isoWeeksInYear, isoWeekString, parseIsoWeek, toDayNumber } from '@/lib/calendar';

describe('ISO 8601 week dates', () => {
  // Check values from ISO 8601 (weeks start Monday; week 01 holds the year's first Thursday).
  it.each([
    ['2019-12-30', '2020-W01-1'],
    ['2006-12-31', '2006-W52-7'],
    ['2016-01-02', '2015-W53-6'],
    ['2022-12-31', '2022-W52-6'],
  ])('ISO 8601: %s = %s', (date, week) => {
    expect(isoWeekString(date)).toBe(week);
    expect(dateFromIsoWeek(week)).toBe(date);
  });

  it('returns the parts', () => {
    expect(isoWeek('2019-12-30')).toEqual({ year: 2020, week: 1, weekday: 1 });
  });

  it('knows 53-week years by the first-Thursday rule (2015, 2020, 2026 have 53; 2019, 2022 have 52)', () => {
    // Derived from the ISO 8601 rule: a year has 53 weeks when it starts on a Thursday, or on a Wednesday in a leap year.
    expect([2015, 2019, 2020, 2022, 2026].map(isoWeeksInYear)).toEqual([53, 52, 53, 52, 53]);
    expect(isoWeekString('2026-12-31')).toBe('2026-W53-4');
    expect(() => parseIsoWeek('2019-W53-1')).toThrow(/2019 has weeks 01–52/);
    expect(() => parseIsoWeek('2019-53-1')).toThrow(/not an ISO week date/);
  });

  it('round-trips every date and keeps weeks Monday-first (property)', () => {
    const day = fc.integer({ min: toDayNumber('1900-01-01'), max: toDayNumber('2200-12-31') });
    fc.assert(
      fc.property(day, (n) => {
        const date = fromDayNumber(n);
        const w = isoWeek(date);
        expect(dateFromIsoWeek(w)).toBe(date);
        expect(w.week).toBeGreaterThanOrEqual(1);
        expect(w.week).toBeLessThanOrEqual(isoWeeksInYear(w.year));
        // The next day is the next weekday, and a new week starts after Sunday.
        const next = isoWeek(fromDayNumber(n + 1));
        expect(next.weekday).toBe(w.weekday === 7 ? 1 : w.weekday + 1);
        if (w.weekday !== 7) expect([next.year, next.week]).toEqual([w.year, w.week]);
      }),
    );
  });
});
