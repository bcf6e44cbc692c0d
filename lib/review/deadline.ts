import { DEADLINE_CONVENTION, deadlineRuleText, PAUSE_RULE_TEXT, reviewClock, type BusinessCalendar, type ClockResult, type PauseInterval } from '@/lib/calendar';

/**
 * The review deadline, stated once:
 * - the clock starts when the claim is submitted, and starts afresh when a denial is appealed;
 * - it runs for the brand policy's `review_days` business days for the part's category
 *   ({@link DEFAULT_REVIEW_DAYS} when the brand has no policy for it), in the brand's calendar and time zone;
 * - the start day does not count, and a deadline on a day off moves to the next business day
 *   (ISDA 2006 §4.12 "Following", `DEADLINE_CONVENTION` in lib/calendar);
 * - it stands still while the claim waits on the dealer (from each request for more to the
 *   dealer's resubmission or withdrawal), by the pause rule of lib/calendar.
 */
export const DEFAULT_REVIEW_DAYS = 5;

export const REVIEW_CONVENTION = DEADLINE_CONVENTION;

/** The events of a claim's log the review clock reads. */
export type ClockEvent = { event: string; at: string };

/** Steps that end a wait on the dealer. */
const ENDS_WAIT = new Set(['RESUBMIT', 'WITHDRAW']);

/**
 * The periods the claim waited on the dealer since the clock started, recovered from the log:
 * each REQUEST_INFO opens a pause, the next RESUBMIT (or WITHDRAW) closes it; one still open has `to: null`.
 */
export function waitingPauses(events: readonly ClockEvent[], startedAt: string): PauseInterval[] {
  const start = Date.parse(startedAt);
  const pauses: PauseInterval[] = [];
  let open: string | null = null;
  for (const e of [...events].sort((a, b) => Date.parse(a.at) - Date.parse(b.at))) {
    if (Date.parse(e.at) < start) continue;
    if (e.event === 'REQUEST_INFO' && open === null) open = e.at;
    else if (ENDS_WAIT.has(e.event) && open !== null) {
      pauses.push({ from: open, to: e.at });
      open = null;
    }
  }
  if (open !== null) pauses.push({ from: open, to: null });
  return pauses;
}

export type BrandClock = { timeZone: string; calendar: BusinessCalendar };

export type ReviewDeadlineInput = BrandClock & {
  startedAt: string;
  now: string;
  reviewDays: number | null;
  events: readonly ClockEvent[];
};

/** The review clock of one claim as of `now`. */
export function reviewDeadline(input: ReviewDeadlineInput): ClockResult {
  return reviewClock({
    startedAt: input.startedAt,
    now: input.now,
    timeZone: input.timeZone,
    calendar: input.calendar,
    allowanceBusinessDays: input.reviewDays ?? DEFAULT_REVIEW_DAYS,
    pauses: waitingPauses(input.events, input.startedAt),
  });
}

/**
 * What `claims.review_due_on` holds, so the queue can sort and filter by deadline in SQL: the due
 * date while the clock runs, null while it is paused (the dealer's turn) or once the claim is decided.
 */
export function storedDueOn(clock: ClockResult): string | null {
  return clock.isPaused ? null : clock.dueDate;
}

/** The two sentences the screens show under a deadline. */
export function reviewRuleText(calendar: BusinessCalendar): string {
  return `${deadlineRuleText(calendar)} ${PAUSE_RULE_TEXT}`;
}
