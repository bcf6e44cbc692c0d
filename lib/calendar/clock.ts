import { compileCalendar, countBusinessDays, isBusinessDayNumber, stepBusinessDays, type BusinessCalendar } from './business-days';
import { CalendarInputError } from './input-error';
import { fromDayNumber, isoWeekdayOfDayNumber, toDayNumber, weekdayName, type IsoDate } from './iso-date';
import { assertTimeZone, localDateOfEpoch, parseInstant, type IsoInstant } from './time-zone';

/** A period the clock stood still (e.g. waiting on the dealer). `to: null` = still paused. */
export interface PauseInterval {
  from: IsoInstant;
  to: IsoInstant | null;
}

export type ClockKind = 'review' | 'core_return';

export type ClockStatus = 'on_track' | 'due_soon' | 'overdue' | 'paused' | 'reminder_due' | 'chargeback_due';

export interface ClockInput {
  /** 'review' (default): from submission; 'core_return': from delivery of the replacement. */
  kind?: ClockKind;
  startedAt: IsoInstant;
  now: IsoInstant;
  /** The brand's IANA time zone; instants become brand-local dates in it. */
  timeZone: string;
  calendar: BusinessCalendar;
  /** The deadline in business days after the start day (≥ 1). */
  allowanceBusinessDays: number;
  pauses?: readonly PauseInterval[];
  /** 'due_soon' once this many business days or fewer are left; default {@link DEFAULT_DUE_SOON_WITHIN}. */
  dueSoonWithinBusinessDays?: number;
  /** Core return only: business days after the due date before a chargeback is due; default 0. */
  graceBusinessDays?: number;
}

export interface ClockResult {
  kind: ClockKind;
  /** Brand-local date of `startedAt` (day 0, does not count). */
  startDate: IsoDate;
  /** Brand-local date of `now`. */
  today: IsoDate;
  /** Always a business day. While paused: the due date if the clock restarted now. */
  dueDate: IsoDate;
  /** Core return: the last day of grace (inclusive); a chargeback is due after it. Null for a review. */
  graceEndsDate: IsoDate | null;
  /** Business days from today to the due date: 0 = due today, negative = overdue by that many. */
  businessDaysLeft: number;
  /** Running (unpaused) business days counted so far, up to the allowance. */
  businessDaysElapsed: number;
  /** Business days that did not count because the clock was paused; each one moved the due date. */
  pausedBusinessDays: number;
  isPaused: boolean;
  status: ClockStatus;
  /** One sentence for the UI. */
  summary: string;
}

/** Our own default, common practice, no source. */
export const DEFAULT_DUE_SOON_WITHIN = 2;

/**
 * How pauses count, precisely: a pause covers the brand-local dates from the date it starts up to,
 * but not including, the date it ends (an open pause ends today). Covered business days do not
 * count and push the due date back one business day each. So a pause that starts and ends on the
 * same local date adds nothing, and a pause from Monday to Wednesday adds Monday and Tuesday.
 * Equivalently, each business day counts for the side the claim stood on at the end of that day.
 */
export const PAUSE_RULE_TEXT =
  'Days waiting on the dealer do not count: a day counts as paused when the claim was still waiting at the end of it, so a question answered the same day adds nothing and a pause from Monday to Wednesday adds two business days.';

/** Computes a business-day clock (review or core return) as of `now`. See {@link PAUSE_RULE_TEXT}. */
export function computeClock(input: ClockInput): ClockResult {
  const kind = input.kind ?? 'review';
  if (kind !== 'review' && kind !== 'core_return') throw new CalendarInputError('kind', `'${String(kind)}' is not 'review' or 'core_return'`);
  assertTimeZone(input.timeZone);
  const cal = compileCalendar(input.calendar);
  const allowance = wholeNumber(input.allowanceBusinessDays, 'allowanceBusinessDays', 1);
  const dueSoonWithin = wholeNumber(input.dueSoonWithinBusinessDays ?? DEFAULT_DUE_SOON_WITHIN, 'dueSoonWithinBusinessDays', 0);
  if (kind === 'review' && input.graceBusinessDays !== undefined) {
    throw new CalendarInputError('graceBusinessDays', 'a grace period applies to the core-return clock only');
  }
  const grace = wholeNumber(input.graceBusinessDays ?? 0, 'graceBusinessDays', 0);

  const startMs = parseInstant(input.startedAt, 'startedAt');
  const nowMs = parseInstant(input.now, 'now');
  if (nowMs < startMs) throw new CalendarInputError('now', `${input.now} is before the clock started (${input.startedAt})`);
  const tz = input.timeZone;
  const start = toDayNumber(localDateOfEpoch(startMs, tz));
  const today = toDayNumber(localDateOfEpoch(nowMs, tz));

  const paused = new Set<number>();
  let isPaused = false;
  (input.pauses ?? []).forEach((p, i) => {
    const field = `pauses[${i}]`;
    if (p === null || typeof p !== 'object') throw new CalendarInputError(field, 'expected { from, to } with to = null while still paused');
    const fromMs = parseInstant(p.from, `${field}.from`);
    const toMs = p.to === null ? null : parseInstant(p.to, `${field}.to`);
    if (fromMs < startMs) throw new CalendarInputError(`${field}.from`, `${p.from} is before the clock started (${input.startedAt})`);
    if (toMs !== null && toMs < fromMs) throw new CalendarInputError(`${field}.to`, `${p.to} is before the pause's start (${p.from})`);
    // The clock is read as of now: a pause not yet begun is ignored, one still running ends now.
    if (fromMs > nowMs) return;
    if (toMs === null || toMs > nowMs) isPaused = true;
    const endMs = toMs === null ? nowMs : Math.min(toMs, nowMs);
    const last = toDayNumber(localDateOfEpoch(endMs, tz));
    for (let d = toDayNumber(localDateOfEpoch(fromMs, tz)); d < last; d++) paused.add(d);
  });

  let due = start;
  let pausedBusinessDays = 0;
  let elapsed = 0;
  for (let counted = 0; counted < allowance; ) {
    due += 1;
    if (!isBusinessDayNumber(due, cal)) continue;
    if (paused.has(due)) {
      pausedBusinessDays += 1;
    } else {
      counted += 1;
      if (due <= today) elapsed += 1;
    }
  }

  const left = countBusinessDays(today, due, cal);
  const graceEnds = kind === 'core_return' ? stepBusinessDays(due, grace, cal) : null;

  let status: ClockStatus;
  if (graceEnds !== null && today > graceEnds) status = 'chargeback_due';
  else if (today > due) status = kind === 'core_return' ? 'reminder_due' : 'overdue';
  else if (isPaused) status = 'paused';
  else if (left <= dueSoonWithin) status = 'due_soon';
  else status = 'on_track';

  return {
    kind,
    startDate: fromDayNumber(start),
    today: fromDayNumber(today),
    dueDate: fromDayNumber(due),
    graceEndsDate: graceEnds === null ? null : fromDayNumber(graceEnds),
    businessDaysLeft: left,
    businessDaysElapsed: elapsed,
    pausedBusinessDays,
    isPaused,
    status,
    summary: summarize(status, due, left, graceEnds, pausedBusinessDays),
  };
}

/** The review clock: starts at submission. */
export function reviewClock(input: Omit<ClockInput, 'kind' | 'graceBusinessDays'>): ClockResult {
  return computeClock({ ...input, kind: 'review' });
}

/** The core-return clock: starts at delivery of the replacement; after the due date a grace period, then a chargeback. */
export function coreReturnClock(input: Omit<ClockInput, 'kind'>): ClockResult {
  return computeClock({ ...input, kind: 'core_return' });
}

function wholeNumber(value: unknown, field: string, min: number): number {
  if (typeof value !== 'number' || !Number.isSafeInteger(value) || value < min) {
    throw new CalendarInputError(field, `expected a whole number of business days ≥ ${min}, got ${JSON.stringify(value)}`);
  }
  return value;
}

function dayLabel(d: number): string {
  return `${weekdayName(isoWeekdayOfDayNumber(d))} ${fromDayNumber(d)}`;
}

function days(n: number): string {
  return `${n} business day${n === 1 ? '' : 's'}`;
}

function summarize(status: ClockStatus, due: number, left: number, graceEnds: number | null, pausedDays: number): string {
  const pausedNote = pausedDays > 0 ? ` Waiting on the dealer added ${days(pausedDays)}.` : '';
  switch (status) {
    case 'chargeback_due':
      return `Not returned by the end of grace on ${dayLabel(graceEnds ?? due)}: chargeback due.${pausedNote}`;
    case 'reminder_due':
      return `Overdue by ${days(-left)} (due ${dayLabel(due)}); grace ends ${dayLabel(graceEnds ?? due)}: remind the dealer.${pausedNote}`;
    case 'overdue':
      return `Overdue by ${days(-left)} (was due ${dayLabel(due)}).${pausedNote}`;
    case 'paused':
      return `Paused, waiting on the dealer; if it restarts today, due ${dayLabel(due)} (${days(left)} left).${pausedNote}`;
    default:
      return left === 0 ? `Due today, ${dayLabel(due)}.${pausedNote}` : `Due ${dayLabel(due)}: ${days(left)} left.${pausedNote}`;
  }
}
