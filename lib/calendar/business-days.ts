import { CalendarInputError } from './input-error';
import { fromDayNumber, isoWeekdayOfDayNumber, toDayNumber, type IsoDate } from './iso-date';

/** A brand's working calendar. Holidays are the brand's local dates. */
export interface BusinessCalendar {
  holidays: readonly IsoDate[];
  /** ISO weekday numbers of the weekly days off (1 = Monday … 7 = Sunday); default Saturday and Sunday. */
  weekend?: readonly number[];
}

export const DEFAULT_WEEKEND: readonly number[] = [6, 7];

/** A calendar checked once and turned into day-number lookups. */
export interface CompiledCalendar {
  readonly weekend: ReadonlySet<number>;
  readonly holidays: ReadonlySet<number>;
}

export function compileCalendar(calendar: BusinessCalendar, field = 'calendar'): CompiledCalendar {
  if (calendar === null || typeof calendar !== 'object') {
    throw new CalendarInputError(field, 'expected a calendar { holidays, weekend? }');
  }
  if (!Array.isArray(calendar.holidays)) {
    throw new CalendarInputError(`${field}.holidays`, 'expected a list of dates YYYY-MM-DD (may be empty)');
  }
  const weekendList = calendar.weekend ?? DEFAULT_WEEKEND;
  if (!Array.isArray(weekendList)) {
    throw new CalendarInputError(`${field}.weekend`, 'expected a list of ISO weekday numbers 1–7');
  }
  const weekend = new Set<number>();
  weekendList.forEach((d, i) => {
    if (!Number.isInteger(d) || d < 1 || d > 7) {
      throw new CalendarInputError(`${field}.weekend[${i}]`, `${JSON.stringify(d)} is not an ISO weekday number 1 (Monday) to 7 (Sunday)`);
    }
    weekend.add(d);
  });
  if (weekend.size === 7) throw new CalendarInputError(`${field}.weekend`, 'every day of the week is a day off; no business day is left');
  const holidays = new Set<number>();
  calendar.holidays.forEach((h, i) => holidays.add(toDayNumber(h, `${field}.holidays[${i}]`)));
  return { weekend, holidays };
}

export function isBusinessDayNumber(dayNumber: number, cal: CompiledCalendar): boolean {
  return !cal.weekend.has(isoWeekdayOfDayNumber(dayNumber)) && !cal.holidays.has(dayNumber);
}

export function isBusinessDay(date: IsoDate, calendar: BusinessCalendar): boolean {
  return isBusinessDayNumber(toDayNumber(date), compileCalendar(calendar));
}

/** The first business day strictly after `date`. */
export function nextBusinessDay(date: IsoDate, calendar: BusinessCalendar): IsoDate {
  return fromDayNumber(stepBusinessDays(toDayNumber(date), 1, compileCalendar(calendar)));
}

/** The last business day strictly before `date`. */
export function previousBusinessDay(date: IsoDate, calendar: BusinessCalendar): IsoDate {
  return fromDayNumber(stepBusinessDays(toDayNumber(date), -1, compileCalendar(calendar)));
}

/**
 * Counting rule: the start day does not count; day 1 is the first business day after `start`
 * (whether or not `start` itself is a business day). `n = 0` returns `start` unchanged; negative
 * `n` counts back the same way (day −1 is the last business day before `start`).
 */
export function addBusinessDays(start: IsoDate, n: number, calendar: BusinessCalendar): IsoDate {
  if (!Number.isSafeInteger(n)) throw new CalendarInputError('n', `expected a whole number of business days, got ${n}`);
  return fromDayNumber(stepBusinessDays(toDayNumber(start, 'start'), n, compileCalendar(calendar)));
}

export function stepBusinessDays(start: number, n: number, cal: CompiledCalendar): number {
  const step = n < 0 ? -1 : 1;
  let d = start;
  for (let left = Math.abs(n); left > 0; ) {
    d += step;
    if (isBusinessDayNumber(d, cal)) left -= 1;
  }
  return d;
}

/**
 * Business days from `a` to `b`, counted like `addBusinessDays` so that
 * businessDaysBetween(a, addBusinessDays(a, n)) = n:
 * - b ≥ a: the business days d with a < d ≤ b (the start day does not count, the end day does);
 * - b < a: minus the business days d with b ≤ d < a (counting backwards from a).
 */
export function businessDaysBetween(a: IsoDate, b: IsoDate, calendar: BusinessCalendar): number {
  return countBusinessDays(toDayNumber(a, 'a'), toDayNumber(b, 'b'), compileCalendar(calendar));
}

export function countBusinessDays(a: number, b: number, cal: CompiledCalendar): number {
  let count = 0;
  if (b >= a) {
    for (let d = a + 1; d <= b; d++) if (isBusinessDayNumber(d, cal)) count += 1;
    return count;
  }
  for (let d = b; d < a; d++) if (isBusinessDayNumber(d, cal)) count += 1;
  return -count;
}

const SHORT_DAY = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'] as const;

/** Working days of a calendar in words, e.g. "Mon–Fri" or "Sun–Thu" or "Mon, Wed, Fri". */
export function describeWorkingDays(calendar: BusinessCalendar): string {
  const { weekend } = compileCalendar(calendar);
  const working = [1, 2, 3, 4, 5, 6, 7].filter((d) => !weekend.has(d));
  // Find a rotation in which the working days are one consecutive run (e.g. Sun–Thu).
  for (let shift = 0; shift < 7; shift++) {
    const rotated = working.map((d) => ((d - 1 - shift + 7) % 7));
    const sorted = [...rotated].sort((x, y) => x - y);
    const first = sorted[0];
    const last = sorted[sorted.length - 1];
    if (first !== undefined && last !== undefined && last - first === sorted.length - 1) {
      const name = (r: number) => SHORT_DAY[(r + shift) % 7] ?? '';
      return sorted.length === 1 ? name(first) : `${name(first)}–${name(last)}`;
    }
  }
  return working.map((d) => SHORT_DAY[d - 1] ?? '').join(', ');
}
