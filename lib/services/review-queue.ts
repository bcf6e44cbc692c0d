import 'server-only';
import { addBusinessDays, DEFAULT_DUE_SOON_WITHIN, localDate, type ClockStatus } from '@/lib/calendar';
import { listPolicies } from '@/lib/db/catalog';
import { brandCalendar, CLOCK_STAGES as CLOCK_STAGE_LIST, listReviewQueue, otherActiveReps, type BrandCalendarRow, type ReviewQueueFilters, type ReviewQueueRow } from '@/lib/db/review';
import type { AppUser } from '@/lib/db/users';
import { ForbiddenError } from '@/lib/errors';
import { reviewDeadline, reviewRuleText } from '@/lib/review';
import { AGE_BUCKETS, QUEUE_VIEWS, type ReviewQueueQuery } from '@/lib/validation/review';

const CLOCK_STAGES = new Set<string>(CLOCK_STAGE_LIST);

/**
 * The brand's time zone, holidays and review days, kept for a minute per process: the queue is
 * read far more often than a brand edits its calendar. Steps and reminders read them fresh.
 */
const SETTINGS_TTL_MS = 60_000;
const settingsCache = new Map<string, { at: number; value: Promise<{ cal: BrandCalendarRow; reviewDays: Map<string, number> }> }>();

function brandSettings(brandId: string, now: Date) {
  const hit = settingsCache.get(brandId);
  if (hit && now.getTime() - hit.at < SETTINGS_TTL_MS) return hit.value;
  const value = Promise.all([brandCalendar(brandId), listPolicies(brandId)]).then(([cal, policies]) => ({
    cal,
    reviewDays: new Map(policies.map((p) => [p.category as string, p.reviewDays])),
  }));
  value.catch(() => settingsCache.delete(brandId));
  settingsCache.set(brandId, { at: now.getTime(), value });
  return value;
}

export type QueueClock = { dueDate: string; businessDaysLeft: number; status: ClockStatus; isPaused: boolean; summary: string };
export type ReviewQueueItem = Omit<ReviewQueueRow, 'clockEvents'> & { clock: QueueClock | null; canTake: boolean; canRelease: boolean };
export type ReviewQueuePage = { rows: ReviewQueueItem[]; total: number; totalCapped: boolean; page: number; pageSize: number; today: string; dueSoonUntil: string; rule: string };

/**
 * The rep's queue: one page of the brand's claims from SQL, each with its review clock as of now
 * (business days in the brand's calendar, paused while waiting on the dealer) and the take/release
 * buttons that apply to this rep.
 */
export async function reviewQueue(user: AppUser, query: ReviewQueueQuery, now = new Date()): Promise<ReviewQueuePage> {
  if (user.role !== 'brand_rep') throw new ForbiddenError('Only a brand rep has a review queue.');
  const brandId = user.organisationId;
  const { cal, reviewDays } = await brandSettings(brandId, now);
  const calendar = { holidays: cal.holidays };
  const today = localDate(now.toISOString(), cal.timeZone);
  const dueSoonUntil = addBusinessDays(today, DEFAULT_DUE_SOON_WITHIN, calendar);

  const filters: ReviewQueueFilters = { stages: [...QUEUE_VIEWS[query.view]], dealerId: query.dealer, category: query.category, q: query.q || undefined };
  if (query.age) filters.age = { minDays: AGE_BUCKETS[query.age].minDays, maxDays: AGE_BUCKETS[query.age].maxDays };
  if (query.deadline === 'overdue') filters.deadline = { kind: 'overdue', today };
  if (query.deadline === 'due_soon') filters.deadline = { kind: 'due_soon', today, until: dueSoonUntil };
  if (query.deadline === 'on_track') filters.deadline = { kind: 'on_track', after: dueSoonUntil };
  if (query.deadline === 'paused') filters.deadline = { kind: 'paused' };
  if (query.assigned === 'me') filters.assigned = { kind: 'me', userId: user.id };
  if (query.assigned === 'nobody') filters.assigned = { kind: 'nobody' };

  // Decided claims have no deadline: "by deadline" lists them latest change first.
  const sort = query.sort === 'deadline' && query.view === 'decided' ? { by: 'updated' as const, dir: 'desc' as const } : { by: query.sort, dir: query.dir };
  const { rows, total, totalCapped } = await listReviewQueue(user, filters, sort, { page: query.page, pageSize: query.pageSize });
  // Only an appeal this rep denied needs to know whether another rep could take it.
  const deniedByMe = rows.some((r) => r.stage === 'appealed' && r.deniedByRepId === user.id);
  const others = deniedByMe ? await otherActiveReps(brandId, user.id) : [];
  const nowIso = now.toISOString();

  const items = rows.map(({ clockEvents, ...r }): ReviewQueueItem => {
    let clock: QueueClock | null = null;
    if (CLOCK_STAGES.has(r.stage) && r.reviewStartedAt) {
      const at = Date.parse(nowIso) < Date.parse(r.reviewStartedAt) ? r.reviewStartedAt : nowIso;
      const c = reviewDeadline({
        startedAt: r.reviewStartedAt, now: at, timeZone: cal.timeZone, calendar,
        reviewDays: (r.partCategory && reviewDays.get(r.partCategory)) || null, events: clockEvents,
      });
      clock = { dueDate: c.dueDate, businessDaysLeft: c.businessDaysLeft, status: c.status, isPaused: c.isPaused, summary: c.summary };
    }
    return {
      ...r,
      clock,
      canTake: (r.stage === 'submitted' || r.stage === 'appealed') && !(r.stage === 'appealed' && r.deniedByRepId === user.id && others.length > 0),
      canRelease: r.stage === 'in_review' && r.assignedRepId === user.id,
    };
  });
  return { rows: items, total, totalCapped, page: query.page, pageSize: query.pageSize, today, dueSoonUntil, rule: reviewRuleText(calendar) };
}
