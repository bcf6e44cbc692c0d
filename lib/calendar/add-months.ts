import { daysInMonth, formatCivil, parseIsoDate, toDayNumber, type IsoDate } from './iso-date';
import { CalendarInputError } from './input-error';

/**
 * Same day-of-month `months` later; when that day does not exist in the target month, the last
 * day of that month (2024-01-31 + 1 month = 2024-02-29; 2024-02-29 + 12 months = 2025-02-28).
 */
export function addMonths(date: IsoDate, months: number, field = 'date'): IsoDate {
  if (!Number.isSafeInteger(months)) throw new CalendarInputError('months', `expected a whole number, got ${months}`);
  const { year, month, day } = parseIsoDate(date, field);
  const index = year * 12 + (month - 1) + months;
  const targetYear = Math.floor(index / 12);
  const targetMonth = index - targetYear * 12 + 1;
  if (targetYear < 1 || targetYear > 9999) {
    throw new CalendarInputError('months', `${date} + ${months} months is outside the years 0001–9999`);
  }
  return formatCivil({ year: targetYear, month: targetMonth, day: Math.min(day, daysInMonth(targetYear, targetMonth)) });
}

export interface MonthsAndDays {
  months: number;
  days: number;
}

/**
 * Whole months from `from` to `to` by the `addMonths` rule (the largest m with
 * addMonths(from, m) ≤ to), then the remaining calendar days. Requires from ≤ to.
 */
export function monthsAndDaysBetween(from: IsoDate, to: IsoDate): MonthsAndDays {
  const start = toDayNumber(from, 'from');
  const end = toDayNumber(to, 'to');
  if (end < start) throw new CalendarInputError('to', `${to} is before ${from}`);
  const a = parseIsoDate(from);
  const b = parseIsoDate(to);
  let months = (b.year - a.year) * 12 + (b.month - a.month);
  // The estimate is at most one too high; clamping to month ends can only make addMonths earlier.
  while (months > 0 && toDayNumber(addMonths(from, months)) > end) months -= 1;
  while (toDayNumber(addMonths(from, months + 1)) <= end) months += 1;
  return { months, days: end - toDayNumber(addMonths(from, months)) };
}
