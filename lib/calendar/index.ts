export { CalendarInputError } from './input-error';
export {
  addDays,
  civilFromDayNumber,
  dayNumberFromCivil,
  daysBetween,
  daysInMonth,
  formatCivil,
  fromDayNumber,
  isIsoDate,
  isLeapYear,
  isoWeekday,
  parseIsoDate,
  toDayNumber,
  weekdayName,
  type CivilDate,
  type IsoDate,
  type IsoWeekday,
} from './iso-date';
export { addMonths, monthsAndDaysBetween, type MonthsAndDays } from './add-months';
export {
  DEFAULT_WEEKEND,
  addBusinessDays,
  businessDaysBetween,
  compileCalendar,
  describeWorkingDays,
  isBusinessDay,
  nextBusinessDay,
  previousBusinessDay,
  type BusinessCalendar,
  type CompiledCalendar,
} from './business-days';
export {
  BUSINESS_DAY_CONVENTIONS,
  DEADLINE_CONVENTION,
  DEADLINE_RULE_TEXT,
  adjustDate,
  adjustDeadline,
  deadlineRuleText,
  type BusinessDayConvention,
} from './day-conventions';
export { dateFromIsoWeek, formatIsoWeek, isoWeek, isoWeekString, isoWeeksInYear, parseIsoWeek, type IsoWeekDate } from './iso-week';
export { assertTimeZone, localDate, parseInstant, type IsoInstant } from './time-zone';
export {
  DEFAULT_DUE_SOON_WITHIN,
  PAUSE_RULE_TEXT,
  computeClock,
  coreReturnClock,
  reviewClock,
  type ClockInput,
  type ClockKind,
  type ClockResult,
  type ClockStatus,
  type PauseInterval,
} from './clock';
