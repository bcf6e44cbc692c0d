import { compileCalendar, isBusinessDayNumber, stepBusinessDays, describeWorkingDays, type BusinessCalendar } from './business-days';
import { civilFromDayNumber, fromDayNumber, toDayNumber, type IsoDate } from './iso-date';
import { CalendarInputError } from './input-error';

/** Business-day conventions of the 2006 ISDA Definitions, Section 4.12. */
export type BusinessDayConvention = 'following' | 'modified_following' | 'preceding';

export const BUSINESS_DAY_CONVENTIONS: readonly BusinessDayConvention[] = ['following', 'modified_following', 'preceding'];

/**
 * Deadlines use ISDA "Following": a deadline that falls on a non-business day moves to the next
 * business day, even into the next month. The party that must act never loses a day to a
 * weekend or holiday, which is the fair reading for both the rep's review and the dealer's core return.
 */
export const DEADLINE_CONVENTION: BusinessDayConvention = 'following';

/** The rule in one sentence for the UI (default Saturday/Sunday weekend). */
export const DEADLINE_RULE_TEXT =
  "Deadlines count business days (Mon–Fri, excluding the brand's holidays); the day the clock starts does not count, and a deadline landing on a day off moves to the next business day (ISDA 'Following').";

/** The same sentence for a calendar with another weekend. */
export function deadlineRuleText(calendar: BusinessCalendar): string {
  return DEADLINE_RULE_TEXT.replace('Mon–Fri', describeWorkingDays(calendar));
}

/**
 * Moves `date` to a business day by an ISDA 2006 §4.12 convention; a business day is returned as is.
 * - following: the first following business day;
 * - modified_following: the first following business day unless it falls in the next calendar
 *   month, in which case the first preceding business day;
 * - preceding: the first preceding business day.
 */
export function adjustDate(date: IsoDate, convention: BusinessDayConvention, calendar: BusinessCalendar): IsoDate {
  if (!BUSINESS_DAY_CONVENTIONS.includes(convention)) {
    throw new CalendarInputError('convention', `'${String(convention)}' is not one of ${BUSINESS_DAY_CONVENTIONS.join(', ')}`);
  }
  const cal = compileCalendar(calendar);
  const d = toDayNumber(date);
  if (isBusinessDayNumber(d, cal)) return date;
  if (convention === 'preceding') return fromDayNumber(stepBusinessDays(d, -1, cal));
  const following = stepBusinessDays(d, 1, cal);
  if (convention === 'modified_following' && civilFromDayNumber(following).month !== civilFromDayNumber(d).month) {
    return fromDayNumber(stepBusinessDays(d, -1, cal));
  }
  return fromDayNumber(following);
}

/** Adjusts a deadline date by the deadline convention ({@link DEADLINE_CONVENTION}). */
export function adjustDeadline(date: IsoDate, calendar: BusinessCalendar): IsoDate {
  return adjustDate(date, DEADLINE_CONVENTION, calendar);
}
