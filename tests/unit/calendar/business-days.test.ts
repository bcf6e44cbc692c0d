import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  addBusinessDays,
  adjustDate,
  adjustDeadline,
  businessDaysBetween,
  DEADLINE_CONVENTION,
  DEADLINE_RULE_TEXT,
  deadlineRuleText,
  describeWorkingDays,
  fromDayNumber,
  isBusinessDay,
  nextBusinessDay,
  previousBusinessDay,
  toDayNumber,
  type BusinessCalendar,
} from '@/lib/calendar';

// Hand-worked calendar, spring 2026 (2026-03-02 is a Monday). An invented brand closes on
// Friday 2026-04-03 and Monday 2026-04-06.
//   Mar 23 Mo 24 Tu 25 We 26 Th 27 Fr | 28 Sa 29 Su
//   Mar 30 Mo 31 Tu  Apr 1 We 2 Th 3 Fr (closed) | 4 Sa 5 Su | Apr 6 Mo (closed) 7 Tu
const brand: BusinessCalendar = { holidays: ['2026-04-03', '2026-04-06'] };

describe('business days', () => {
  it('skips weekends (Sat = 6, Sun = 7 by default) and the brand holidays', () => {
    expect(isBusinessDay('2026-03-02', brand)).toBe(true);
    expect(isBusinessDay('2026-03-07', brand)).toBe(false);
    expect(isBusinessDay('2026-03-08', brand)).toBe(false);
    expect(isBusinessDay('2026-04-03', brand)).toBe(false);
    expect(isBusinessDay('2026-04-07', brand)).toBe(true);
  });

  it('supports another weekend (Fri + Sat off: Sun–Thu working)', () => {
    const cal = { holidays: [], weekend: [5, 6] };
    expect(isBusinessDay('2026-03-06', cal)).toBe(false);
    expect(isBusinessDay('2026-03-08', cal)).toBe(true);
    expect(describeWorkingDays(cal)).toBe('Sun–Thu');
    expect(describeWorkingDays(brand)).toBe('Mon–Fri');
    expect(describeWorkingDays({ holidays: [], weekend: [2, 4, 6, 7] })).toBe('Mon, Wed, Fri');
    expect(deadlineRuleText(cal)).toContain('(Sun–Thu, excluding');
  });

  it('counts from the day after the start (start day does not count)', () => {
    expect(addBusinessDays('2026-03-27', 1, brand)).toBe('2026-03-30');
    expect(addBusinessDays('2026-03-27', 5, brand)).toBe('2026-04-07'); // 30, 31, 1, 2, (3–6 off), 7
    expect(addBusinessDays('2026-03-07', 1, brand)).toBe('2026-03-09'); // started on a Saturday
    expect(addBusinessDays('2026-03-27', 0, brand)).toBe('2026-03-27');
    expect(addBusinessDays('2026-04-07', -1, brand)).toBe('2026-04-02');
    expect(nextBusinessDay('2026-04-02', brand)).toBe('2026-04-07');
    expect(previousBusinessDay('2026-04-07', brand)).toBe('2026-04-02');
  });

  it('a 10-business-day deadline from Fri 2026-03-20 skips the closed days and lands on Tue 2026-04-07', () => {
    // By hand: 23 24 25 26 27 30 31 1 2 = 9, then 3 (closed) 4 5 (weekend) 6 (closed), 7 = 10.
    expect(addBusinessDays('2026-03-20', 10, brand)).toBe('2026-04-07');
  });

  it('counts business days between dates by the same rule', () => {
    expect(businessDaysBetween('2026-03-27', '2026-04-07', brand)).toBe(5);
    expect(businessDaysBetween('2026-04-07', '2026-03-27', brand)).toBe(-5);
    expect(businessDaysBetween('2026-03-27', '2026-03-27', brand)).toBe(0);
    expect(businessDaysBetween('2026-04-02', '2026-04-06', brand)).toBe(0);
    expect(businessDaysBetween('2026-04-08', '2026-04-07', brand)).toBe(-1);
  });

  it('refuses a bad calendar and names the entry', () => {
    expect(() => isBusinessDay('2026-03-02', { holidays: ['2026-04-03', '2026-04-31'] })).toThrow(/calendar\.holidays\[1\]: '2026-04-31': day 31 does not exist/);
    expect(() => isBusinessDay('2026-03-02', { holidays: [], weekend: [0] })).toThrow(/calendar\.weekend\[0\]: 0 is not an ISO weekday/);
    expect(() => isBusinessDay('2026-03-02', { holidays: [], weekend: [1, 2, 3, 4, 5, 6, 7] })).toThrow(/no business day is left/);
    expect(() => addBusinessDays('2026-03-02', 1.5, brand)).toThrow(/n: expected a whole number/);
    expect(() => addBusinessDays('2026-3-2', 1, brand)).toThrow(/start: '2026-3-2' is not a date/);
  });
});

describe('ISDA 2006 §4.12 business-day conventions', () => {
  it("deadlines use 'Following'", () => {
    expect(DEADLINE_CONVENTION).toBe('following');
    expect(DEADLINE_RULE_TEXT).toMatch(/next business day \(ISDA 'Following'\)/);
  });

  it('a deadline landing on a brand holiday moves to the next business day (ISDA Following)', () => {
    expect(adjustDeadline('2026-04-03', brand)).toBe('2026-04-07');
    expect(adjustDeadline('2026-04-02', brand)).toBe('2026-04-02');
  });

  it('Following, Modified Following and Preceding on a holiday inside the month (ISDA §4.12)', () => {
    expect(adjustDate('2026-04-03', 'following', brand)).toBe('2026-04-07');
    expect(adjustDate('2026-04-03', 'modified_following', brand)).toBe('2026-04-07');
    expect(adjustDate('2026-04-03', 'preceding', brand)).toBe('2026-04-02');
  });

  it('Modified Following steps back when Following would cross into the next month (ISDA §4.12)', () => {
    // 2026-05-30 is a Saturday; the next business day is Monday 2026-06-01.
    expect(adjustDate('2026-05-30', 'following', brand)).toBe('2026-06-01');
    expect(adjustDate('2026-05-30', 'modified_following', brand)).toBe('2026-05-29');
    expect(adjustDate('2026-05-30', 'preceding', brand)).toBe('2026-05-29');
    // 2026-01-31 is a Saturday.
    expect(adjustDate('2026-01-31', 'modified_following', brand)).toBe('2026-01-30');
    expect(adjustDate('2026-01-31', 'modified_following', { holidays: ['2026-01-30'] })).toBe('2026-01-29');
    expect(() => adjustDate('2026-01-31', 'nearest' as never, brand)).toThrow(/convention: 'nearest' is not one of/);
  });
});

describe('business-day properties (fast-check)', () => {
  const day = fc.integer({ min: toDayNumber('2000-01-01'), max: toDayNumber('2040-12-31') });
  const calendar = fc.record({
    holidays: fc.array(day.map(fromDayNumber), { maxLength: 40 }),
    weekend: fc.subarray([1, 2, 3, 4, 5, 6, 7], { maxLength: 6 }),
  });

  it('businessDaysBetween(a, addBusinessDays(a, n)) = n, and the result is a business day', () => {
    fc.assert(
      fc.property(day, fc.integer({ min: -200, max: 200 }), calendar, (start, n, cal) => {
        const a = fromDayNumber(start);
        const b = addBusinessDays(a, n, cal);
        expect(businessDaysBetween(a, b, cal)).toBe(n);
        if (n !== 0) expect(isBusinessDay(b, cal)).toBe(true);
      }),
    );
  });

  it('every convention returns a business day; Following never earlier, Preceding never later', () => {
    fc.assert(
      fc.property(day, calendar, (d, cal) => {
        const date = fromDayNumber(d);
        const f = adjustDate(date, 'following', cal);
        const p = adjustDate(date, 'preceding', cal);
        const mf = adjustDate(date, 'modified_following', cal);
        for (const r of [f, p, mf]) expect(isBusinessDay(r, cal)).toBe(true);
        expect(toDayNumber(f)).toBeGreaterThanOrEqual(d);
        expect(toDayNumber(p)).toBeLessThanOrEqual(d);
        expect([f, p]).toContain(mf);
      }),
    );
  });
});
