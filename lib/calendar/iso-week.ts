import { CalendarInputError } from './input-error';
import { civilFromDayNumber, dayNumberFromCivil, fromDayNumber, isoWeekdayOfDayNumber, toDayNumber, type IsoDate, type IsoWeekday } from './iso-date';

/** An ISO 8601 week date: weeks start on Monday; week 01 is the week holding the year's first Thursday. */
export interface IsoWeekDate {
  year: number;
  week: number;
  weekday: IsoWeekday;
}

export function isoWeek(date: IsoDate): IsoWeekDate {
  const d = toDayNumber(date);
  const weekday = isoWeekdayOfDayNumber(d);
  // A week belongs to the year of its Thursday.
  const thursday = d + (4 - weekday);
  const year = civilFromDayNumber(thursday).year;
  const week = Math.floor((thursday - dayNumberFromCivil(year, 1, 1)) / 7) + 1;
  return { year, week, weekday };
}

/** 52 or 53: a year has 53 ISO weeks when its 28 December falls in week 53. */
export function isoWeeksInYear(year: number): 52 | 53 {
  return isoWeek(fromDayNumber(dayNumberFromCivil(year, 12, 28))).week === 53 ? 53 : 52;
}

/** Extended format, e.g. `2020-W01-1`. */
export function formatIsoWeek({ year, week, weekday }: IsoWeekDate): string {
  return `${String(year).padStart(4, '0')}-W${String(week).padStart(2, '0')}-${weekday}`;
}

export function isoWeekString(date: IsoDate): string {
  return formatIsoWeek(isoWeek(date));
}

const ISO_WEEK = /^(\d{4})-W(\d{2})-([1-7])$/;

export function parseIsoWeek(value: string, field = 'week'): IsoWeekDate {
  const m = ISO_WEEK.exec(value);
  if (!m) throw new CalendarInputError(field, `'${value}' is not an ISO week date like 2020-W01-1`);
  const year = Number(m[1]);
  const week = Number(m[2]);
  const weeks = isoWeeksInYear(year);
  if (week < 1 || week > weeks) throw new CalendarInputError(field, `'${value}': ${year} has weeks 01–${weeks}`);
  return { year, week, weekday: Number(m[3]) as IsoWeekday };
}

export function dateFromIsoWeek(week: IsoWeekDate | string): IsoDate {
  const w = typeof week === 'string' ? parseIsoWeek(week) : parseIsoWeek(formatIsoWeek(week));
  // 4 January is always in week 01.
  const jan4 = dayNumberFromCivil(w.year, 1, 4);
  const mondayOfWeek1 = jan4 - (isoWeekdayOfDayNumber(jan4) - 1);
  return fromDayNumber(mondayOfWeek1 + (w.week - 1) * 7 + (w.weekday - 1));
}
