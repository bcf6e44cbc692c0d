import { addMonths as dfAddMonths } from 'date-fns';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addDays, fromDayNumber, toDayNumber } from '@/lib/calendar';
import { assessCoverage, coverageEndDate } from '@/lib/coverage';

// Reference library: date-fns addMonths ("if the day of the month does not exist in the target
// month, the last day of the month is used"), the same convention as COVERAGE_PERIOD_RULE_TEXT.
// It works on local-time Date objects, so only the local y/m/d are read back.
function referenceEnd(iso: string, months: number): string {
  const [y, m, d] = iso.split('-').map(Number) as [number, number, number];
  const start = new Date(2000, 0, 1, 12);
  start.setFullYear(y, m - 1, d);
  const r = dfAddMonths(start, months);
  return `${String(r.getFullYear()).padStart(4, '0')}-${String(r.getMonth() + 1).padStart(2, '0')}-${String(r.getDate()).padStart(2, '0')}`;
}

const saleDate = fc.integer({ min: toDayNumber('1990-01-01'), max: toDayNumber('2060-12-31') }).map(fromDayNumber);
const months = fc.integer({ min: 1, max: 120 });

describe('coverage end date (properties, fast-check)', () => {
  it('matches date-fns addMonths for any sale date and period', () => {
    fc.assert(fc.property(saleDate, months, (sale, n) => {
        expect(coverageEndDate(sale, n)).toBe(referenceEnd(sale, n));
      }));
  });

  it('the end day is covered and the day after is not', () => {
    fc.assert(
      fc.property(saleDate, months, (sale, n) => {
        const policy = { category: 'frame' as const, coverageMonths: n, exclusions: [] };
        const end = coverageEndDate(sale, n);
        const at = assessCoverage({ policy, saleDate: sale, failureDate: end, proofOfPurchase: true, registered: false });
        const after = assessCoverage({ policy, saleDate: sale, failureDate: addDays(end, 1), proofOfPurchase: true, registered: false });
        expect(at.covered).toBe(true);
        expect(after.covered).toBe(false);
        expect(at.monthsElapsed).toBe(n);
      }),
    );
  });
});
