import { CalendarInputError } from './input-error';

/** A calendar date `YYYY-MM-DD` (proleptic Gregorian, no time zone). */
export type IsoDate = string;

/** ISO 8601 weekday: 1 = Monday … 7 = Sunday. */
export type IsoWeekday = 1 | 2 | 3 | 4 | 5 | 6 | 7;

export interface CivilDate {
  year: number;
  month: number;
  day: number;
}

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

export function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

export function daysInMonth(year: number, month: number): number {
  if (month === 2) return isLeapYear(year) ? 29 : 28;
  return [4, 6, 9, 11].includes(month) ? 30 : 31;
}

// Integer day numbers (1970-01-01 = 0) keep date arithmetic free of time zones and DST.
// Algorithm: H. Hinnant, "chrono-Compatible Low-Level Date Algorithms" (days_from_civil).
export function dayNumberFromCivil(year: number, month: number, day: number): number {
  const y = month <= 2 ? year - 1 : year;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const doy = Math.floor((153 * (month + (month > 2 ? -3 : 9)) + 2) / 5) + day - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

export function civilFromDayNumber(dayNumber: number): CivilDate {
  const z = dayNumber + 719468;
  const era = Math.floor(z / 146097);
  const doe = z - era * 146097;
  const yoe = Math.floor((doe - Math.floor(doe / 1460) + Math.floor(doe / 36524) - Math.floor(doe / 146096)) / 365);
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const day = doy - Math.floor((153 * mp + 2) / 5) + 1;
  const month = mp < 10 ? mp + 3 : mp - 9;
  return { year: yoe + era * 400 + (month <= 2 ? 1 : 0), month, day };
}

/** Parses and checks a `YYYY-MM-DD` date; `field` names the input in the error message. */
export function parseIsoDate(value: unknown, field = 'date'): CivilDate {
  if (typeof value !== 'string') {
    throw new CalendarInputError(field, `expected a date as text YYYY-MM-DD, got ${describe(value)}`);
  }
  const m = ISO_DATE.exec(value);
  if (!m) throw new CalendarInputError(field, `'${value}' is not a date in the form YYYY-MM-DD`);
  const year = Number(m[1]);
  const month = Number(m[2]);
  const day = Number(m[3]);
  if (year < 1) throw new CalendarInputError(field, `'${value}': year must be 0001 or later`);
  if (month < 1 || month > 12) throw new CalendarInputError(field, `'${value}': month ${m[2]} does not exist`);
  if (day < 1 || day > daysInMonth(year, month)) {
    throw new CalendarInputError(field, `'${value}': day ${m[3]} does not exist in ${year}-${m[2]}`);
  }
  return { year, month, day };
}

export function isIsoDate(value: unknown): value is IsoDate {
  try {
    parseIsoDate(value);
    return true;
  } catch {
    return false;
  }
}

export function toDayNumber(date: IsoDate, field = 'date'): number {
  const { year, month, day } = parseIsoDate(date, field);
  return dayNumberFromCivil(year, month, day);
}

export function formatCivil({ year, month, day }: CivilDate): IsoDate {
  return `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
}

export function fromDayNumber(dayNumber: number): IsoDate {
  if (!Number.isSafeInteger(dayNumber)) throw new CalendarInputError('dayNumber', `expected a whole number, got ${dayNumber}`);
  const civil = civilFromDayNumber(dayNumber);
  if (civil.year < 1 || civil.year > 9999) {
    throw new CalendarInputError('dayNumber', `${dayNumber} is outside the years 0001–9999`);
  }
  return formatCivil(civil);
}

export function addDays(date: IsoDate, days: number): IsoDate {
  if (!Number.isSafeInteger(days)) throw new CalendarInputError('days', `expected a whole number, got ${days}`);
  return fromDayNumber(toDayNumber(date) + days);
}

/** Calendar days from `a` to `b` (positive when `b` is later). */
export function daysBetween(a: IsoDate, b: IsoDate): number {
  return toDayNumber(b, 'b') - toDayNumber(a, 'a');
}

export function isoWeekdayOfDayNumber(dayNumber: number): IsoWeekday {
  // 1970-01-01 was a Thursday (ISO weekday 4).
  return ((((dayNumber + 3) % 7) + 7) % 7 + 1) as IsoWeekday;
}

export function isoWeekday(date: IsoDate): IsoWeekday {
  return isoWeekdayOfDayNumber(toDayNumber(date));
}

const WEEKDAY_NAMES = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'] as const;

export function weekdayName(weekday: IsoWeekday): string {
  return WEEKDAY_NAMES[weekday - 1] ?? '';
}

function describe(value: unknown): string {
  if (value === null) return 'null';
  if (value === undefined) return 'nothing';
  return `${typeof value} ${JSON.stringify(value)}`;
}
