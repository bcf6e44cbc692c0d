import { describe, expect, it } from 'vitest';
import { assessCoverage, COVERAGE_PERIOD_RULE_TEXT, coverageEndDate, type CoveragePolicy } from '@/lib/coverage';

// Convention under test (our choice, stated in COVERAGE_PERIOD_RULE_TEXT): N months of coverage end
// on the same day-of-month N months after the sale, that day covered; when the end month has no
// such day, on its last day. Month lengths and leap years: Gregorian calendar (ISO 8601 §4.3.2:
// leap years are divisible by 4, except centuries not divisible by 400).
const motor: CoveragePolicy = { category: 'drive_unit', coverageMonths: 24, exclusions: [] };
const check = (saleDate: string, failureDate: string, coverageMonths = 24) =>
  assessCoverage({ policy: { ...motor, coverageMonths }, saleDate, failureDate, proofOfPurchase: true, registered: false });

describe('coverage period boundaries (end day inclusive)', () => {
  it('states the convention', () => {
    expect(COVERAGE_PERIOD_RULE_TEXT).toMatch(/that day included/);
    expect(COVERAGE_PERIOD_RULE_TEXT).toMatch(/through its last day/);
  });

  it('explains the period in a plain sentence (sold 2025-03-14, failed 2026-11-02)', () => {
    const a = check('2025-03-14', '2026-11-02');
    expect(a.covered).toBe(true);
    expect(a.coverageEnds).toBe('2027-03-14');
    expect([a.monthsElapsed, a.daysAfterMonths]).toEqual([19, 19]);
    const period = a.reasons.find((r) => r.code === 'coverage_period');
    expect(period).toEqual({
      code: 'coverage_period',
      ok: true,
      outcome: 'pass',
      text: 'Sold 2025-03-14; covered for 24 months, until 2027-03-14 (inclusive); failed 2026-11-02, 19 months and 19 days after sale.',
    });
  });

  it('the last covered day is covered; the first uncovered day is not', () => {
    expect(check('2025-03-14', '2027-03-14').covered).toBe(true);
    const after = check('2025-03-14', '2027-03-15');
    expect(after.covered).toBe(false);
    expect(after.summary).toBe(
      'Not covered. Sold 2025-03-14; covered for 24 months, until 2027-03-14 (inclusive); failed 2027-03-15, 24 months and 1 day after sale: 1 day after coverage ended.',
    );
  });

  it('a failure on the sale day is covered', () => {
    const a = check('2025-03-14', '2025-03-14');
    expect(a.covered).toBe(true);
    expect(a.reasons.find((r) => r.code === 'coverage_period')?.text).toMatch(/failed 2025-03-14, 0 days after sale\.$/);
  });

  it('Jan 31 + 1 month ends on the last day of February (28 in 2026, 29 in leap year 2024)', () => {
    expect(coverageEndDate('2026-01-31', 1)).toBe('2026-02-28');
    expect(check('2026-01-31', '2026-02-28', 1).covered).toBe(true);
    expect(check('2026-01-31', '2026-03-01', 1).covered).toBe(false);
    expect(coverageEndDate('2024-01-31', 1)).toBe('2024-02-29');
    expect(check('2024-01-31', '2024-02-29', 1).covered).toBe(true);
    expect(check('2024-01-31', '2024-03-01', 1).covered).toBe(false);
    expect(coverageEndDate('2026-08-31', 1)).toBe('2026-09-30');
  });

  it('a 29 February sale: + 12 months ends 2025-02-28; + 48 months ends 2028-02-29 (2028 is a leap year)', () => {
    expect(coverageEndDate('2024-02-29', 12)).toBe('2025-02-28');
    expect(check('2024-02-29', '2025-02-28', 12).covered).toBe(true);
    expect(check('2024-02-29', '2025-03-01', 12).covered).toBe(false);
    expect(coverageEndDate('2024-02-29', 48)).toBe('2028-02-29');
    expect(check('2024-02-29', '2028-02-29', 48).covered).toBe(true);
    const late = check('2024-02-29', '2028-03-01', 48);
    expect(late.covered).toBe(false);
    expect(late.reasons[1]?.text).toMatch(/48 months and 1 day after sale: 1 day after coverage ended\.$/);
  });

  it('says "exactly" on a whole number of months', () => {
    expect(check('2025-03-14', '2026-03-14').reasons[1]?.text).toMatch(/exactly 12 months after sale\./);
  });
});
