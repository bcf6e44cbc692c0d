import { addMonths, monthsAndDaysBetween, toDayNumber, type IsoDate } from '@/lib/calendar';

/**
 * The month-arithmetic convention, chosen and stated once: coverage of N months runs from the sale
 * date through the same day-of-month N months later, inclusive; when that day does not exist in
 * the end month, through that month's last day. So 2026-01-31 + 1 month ends 2026-02-28, and
 * 2024-02-29 + 12 months ends 2025-02-28. A failure on the end day is covered; the next day is not.
 */
export const COVERAGE_PERIOD_RULE_TEXT =
  'Coverage runs from the sale date through the same day of the month N months later, that day included; when the month has no such day, through its last day.';

/** The last covered day (inclusive). */
export function coverageEndDate(saleDate: IsoDate, coverageMonths: number): IsoDate {
  return addMonths(saleDate, coverageMonths, 'saleDate');
}

export interface CoveragePeriod {
  coverageEnds: IsoDate;
  /** Whole months from sale to failure (same-day-of-month rule, clamped to month ends). */
  monthsElapsed: number;
  /** Days after the last whole month. */
  daysAfterMonths: number;
  withinPeriod: boolean;
  /** Days the failure came after the last covered day (0 when within). */
  daysPastEnd: number;
}

export function coveragePeriod(saleDate: IsoDate, failureDate: IsoDate, coverageMonths: number): CoveragePeriod {
  const coverageEnds = coverageEndDate(saleDate, coverageMonths);
  const { months, days } = monthsAndDaysBetween(saleDate, failureDate);
  const past = toDayNumber(failureDate) - toDayNumber(coverageEnds);
  return { coverageEnds, monthsElapsed: months, daysAfterMonths: days, withinPeriod: past <= 0, daysPastEnd: Math.max(0, past) };
}
