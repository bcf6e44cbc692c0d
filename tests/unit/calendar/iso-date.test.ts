import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addDays, addMonths, CalendarInputError, daysBetween, fromDayNumber, isoWeekday, monthsAndDaysBetween, parseIsoDate, toDayNumber } from '@/lib/calendar';

// Independent reference: ECMAScript Date in UTC (ECMA-262 §21.4.1, proleptic Gregorian calendar).
const utcDayNumber = (y: number, m: number, d: number) => {
  const t = new Date(0);
  t.setUTCFullYear(y, m - 1, d);
  return Math.round(t.getTime() / 86_400_000);
};

describe('ISO dates as integer day numbers', () => {
  it('1970-01-01 is day 0 and 2000-03-01 is day 11017 (ECMA-262 Date.UTC)', () => {
    expect(toDayNumber('1970-01-01')).toBe(0);
    expect(toDayNumber('2000-03-01')).toBe(Date.UTC(2000, 2, 1) / 86_400_000);
    expect(fromDayNumber(-1)).toBe('1969-12-31');
  });

  it('agrees with ECMAScript Date for any date in years 0001–9999 (property, ECMA-262 §21.4.1)', () => {
    fc.assert(
      fc.property(fc.date({ min: new Date(Date.UTC(1, 0, 1)), max: new Date(Date.UTC(9999, 11, 31)), noInvalidDate: true }), (dt) => {
        const y = dt.getUTCFullYear();
        const m = dt.getUTCMonth() + 1;
        const d = dt.getUTCDate();
        const iso = `${String(y).padStart(4, '0')}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`;
        expect(toDayNumber(iso)).toBe(utcDayNumber(y, m, d));
        expect(fromDayNumber(utcDayNumber(y, m, d))).toBe(iso);
        // getUTCDay: 0 = Sunday; ISO 8601 weekday: 7 = Sunday.
        expect(isoWeekday(iso)).toBe(dt.getUTCDay() === 0 ? 7 : dt.getUTCDay());
      }),
    );
  });

  it('adds days across month, year and leap-day boundaries', () => {
    expect(addDays('2024-02-28', 1)).toBe('2024-02-29'); // 2024 is a leap year (divisible by 4)
    expect(addDays('2023-02-28', 1)).toBe('2023-03-01');
    expect(addDays('2100-02-28', 1)).toBe('2100-03-01'); // 2100 is not (divisible by 100, not 400)
    expect(addDays('2000-02-28', 1)).toBe('2000-02-29'); // 2000 is (divisible by 400)
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01');
    expect(daysBetween('2026-03-01', '2025-03-01')).toBe(-365);
  });

  it('refuses malformed or impossible dates and names the field', () => {
    expect(() => parseIsoDate('2026-02-29', 'saleDate')).toThrow(/saleDate: '2026-02-29': day 29 does not exist in 2026-02/);
    expect(() => parseIsoDate('2026-13-01', 'saleDate')).toThrow(/month 13 does not exist/);
    expect(() => parseIsoDate('1/3/2026', 'failureDate')).toThrow(/failureDate: '1\/3\/2026' is not a date in the form YYYY-MM-DD/);
    expect(() => parseIsoDate('2026-03-01T00:00:00Z')).toThrow(CalendarInputError);
    expect(() => parseIsoDate(null, 'saleDate')).toThrow(/saleDate: expected a date as text/);
  });
});

describe('adding months (same day-of-month, else the last day of that month)', () => {
  it('clamps to the month end', () => {
    expect(addMonths('2026-01-31', 1)).toBe('2026-02-28');
    expect(addMonths('2024-01-31', 1)).toBe('2024-02-29');
    expect(addMonths('2026-03-31', 1)).toBe('2026-04-30');
    expect(addMonths('2026-03-14', 24)).toBe('2028-03-14');
    expect(addMonths('2026-03-14', -3)).toBe('2025-12-14');
  });

  it('handles a 29 February start', () => {
    expect(addMonths('2024-02-29', 12)).toBe('2025-02-28');
    expect(addMonths('2024-02-29', 48)).toBe('2028-02-29');
  });

  it('counts whole months then days (2025-03-14 → 2026-11-02 = 19 months 19 days, counted by hand)', () => {
    expect(monthsAndDaysBetween('2025-03-14', '2026-11-02')).toEqual({ months: 19, days: 19 });
    expect(monthsAndDaysBetween('2026-01-31', '2026-02-28')).toEqual({ months: 1, days: 0 });
    expect(monthsAndDaysBetween('2026-01-31', '2026-03-01')).toEqual({ months: 1, days: 1 });
    expect(monthsAndDaysBetween('2026-03-14', '2026-03-14')).toEqual({ months: 0, days: 0 });
    expect(() => monthsAndDaysBetween('2026-03-14', '2026-03-13')).toThrow(/before/);
  });

  it('whole months m satisfy addMonths(from, m) ≤ to < addMonths(from, m + 1) (property)', () => {
    const day = fc.integer({ min: toDayNumber('1990-01-01'), max: toDayNumber('2060-12-31') }).map(fromDayNumber);
    fc.assert(
      fc.property(day, fc.integer({ min: 0, max: 4000 }), (from, span) => {
        const to = addDays(from, span);
        const { months, days } = monthsAndDaysBetween(from, to);
        expect(addDays(addMonths(from, months), days)).toBe(to);
        expect(toDayNumber(addMonths(from, months + 1))).toBeGreaterThan(toDayNumber(to));
      }),
    );
  });
});
