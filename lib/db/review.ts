import 'server-only';
import { cappedCount, type PageTotal } from '@/lib/db/paging';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import { scopeClaims } from '@/lib/db/claims';
import type { AppUser } from '@/lib/db/users';
import type { ClockEvent } from '@/lib/review/deadline';

/** The log entries the review clock and the "since you asked" view read. */
const CLOCK_EVENTS = ['SUBMIT', 'REQUEST_INFO', 'RESUBMIT', 'WITHDRAW', 'APPEAL'];

export type BrandCalendarRow = { timeZone: string; holidays: string[] };

export async function brandCalendar(brandId: string, q: Knex = db()): Promise<BrandCalendarRow> {
  const org = await q('organisations').where({ id: brandId }).first('time_zone as timeZone');
  const days = await q('brand_holidays').where({ brand_id: brandId }).orderBy('day').select('day');
  return { timeZone: (org?.timeZone as string) ?? 'UTC', holidays: days.map((d) => d.day as string) };
}

/** The brand's review allowance in business days for a part category; null without a policy. */
export async function reviewDaysFor(brandId: string, category: string | null, q: Knex = db()): Promise<number | null> {
  if (!category) return null;
  const row = await q('warranty_policies').where({ brand_id: brandId, category }).first('review_days');
  return row ? Number(row.review_days) : null;
}

export async function appealDaysFor(brandId: string, category: string | null, q: Knex = db()): Promise<number | null> {
  if (!category) return null;
  const row = await q('warranty_policies').where({ brand_id: brandId, category }).first('appeal_days');
  return row ? Number(row.appeal_days) : null;
}

export async function reviewStartedAt(claimId: string, q: Knex = db()): Promise<Date | null> {
  const row = await q('claims').where({ id: claimId }).first('review_started_at');
  return (row?.review_started_at as Date | null) ?? null;
}

/** Clock events of several claims at once, oldest first, keyed by claim. */
export async function clockEventsFor(claimIds: string[], q: Knex = db()): Promise<Map<string, ClockEvent[]>> {
  const out = new Map<string, ClockEvent[]>();
  if (!claimIds.length) return out;
  const rows = await q('claim_events')
    .select('claim_id as claimId', 'event', 'created_at as at')
    .whereIn('claim_id', claimIds)
    .whereIn('event', CLOCK_EVENTS)
    .orderBy([{ column: 'claim_id' }, { column: 'id' }]);
  for (const r of rows) {
    const list = out.get(r.claimId) ?? [];
    list.push({ event: r.event, at: new Date(r.at).toISOString() });
    out.set(r.claimId, list);
  }
  return out;
}

/** Active reps of the brand other than this one (an appeal goes to one of them when there is one). */
export async function otherActiveReps(brandId: string, exceptUserId: string, q: Knex = db()): Promise<{ id: string; email: string; name: string }[]> {
  return q('users')
    .select('id', 'email', 'name')
    .where({ organisation_id: brandId, role: 'brand_rep' })
    .whereNot({ id: exceptUserId })
    .whereNull('disabled_at')
    .orderBy('name');
}

export async function userNames(ids: string[], q: Knex = db()): Promise<Map<string, string>> {
  const unique = [...new Set(ids.filter(Boolean))];
  if (!unique.length) return new Map();
  const rows = await q('users').select('id', 'name').whereIn('id', unique);
  return new Map(rows.map((r) => [r.id as string, r.name as string]));
}

// ---- the review queue ----

export type ReviewQueueFilters = {
  stages: string[];
  dealerId?: string;
  category?: string;
  /** Submitted at least `minDays` and less than `maxDays` calendar days ago. */
  age?: { minDays: number; maxDays: number | null };
  deadline?: { kind: 'overdue'; today: string } | { kind: 'due_soon'; today: string; until: string } | { kind: 'paused' } | { kind: 'on_track'; after: string };
  assigned?: { kind: 'me'; userId: string } | { kind: 'nobody' };
  q?: string;
};

export type ReviewQueueSort = 'deadline' | 'age' | 'number' | 'updated';

export type ReviewQueueRow = {
  id: string;
  number: string;
  stage: string;
  version: number;
  dealerId: string;
  dealerName: string;
  partNumber: string | null;
  partName: string | null;
  partCategory: string | null;
  modelName: string | null;
  frameSerial: string;
  submittedAt: string | null;
  reviewStartedAt: string | null;
  reviewDueOn: string | null;
  assignedRepId: string | null;
  assignedRepName: string | null;
  deniedByRepId: string | null;
  appealsUsed: number;
  updatedAt: string;
  /** The clock's log entries, oldest first, for a claim whose review clock runs; empty otherwise. */
  clockEvents: ClockEvent[];
};

/** Stages in which a claim's review clock runs. */
export const CLOCK_STAGES = ['submitted', 'in_review', 'waiting_on_dealer', 'appealed'] as const;

const SORT_COLUMNS: Record<ReviewQueueSort, string> = {
  deadline: 'c.review_due_on',
  age: 'c.submitted_at',
  number: 'c.number',
  updated: 'c.updated_at',
};
/** The same order on the selected page (its columns under their selected names). */
const PAGE_SORT_COLUMNS: Record<ReviewQueueSort, string> = { deadline: 'reviewDueOn', age: 'submittedAt', number: 'number', updated: 'updatedAt' };

/**
 * One page of the claims against the rep's brand, filtered and sorted in SQL. The open claims are
 * served by claims_review_open_due (brand_id, review_due_on, id, carrying the filter columns, so a
 * filtered count reads the index only) and claims_review_open_age (by submission); decided ones
 * by claims_brand_stage_due and claims_brand_updated.
 */
export async function listReviewQueue(
  user: AppUser,
  f: ReviewQueueFilters,
  sort: { by: ReviewQueueSort; dir: 'asc' | 'desc' },
  page: { page: number; pageSize: number },
): Promise<{ rows: ReviewQueueRow[] } & PageTotal> {
  const filtered = scopeClaims(db()('claims as c'), user);
  if (f.stages.length) filtered.whereIn('c.stage', f.stages);
  if (f.dealerId) filtered.where('c.dealer_id', f.dealerId);
  if (f.category) filtered.where('c.part_category', f.category);
  if (f.age) {
    filtered.where('c.submitted_at', '<=', db().raw(`now() - make_interval(days => ?)`, [f.age.minDays]));
    if (f.age.maxDays !== null) filtered.where('c.submitted_at', '>', db().raw(`now() - make_interval(days => ?)`, [f.age.maxDays]));
  }
  if (f.deadline) {
    const d = f.deadline;
    if (d.kind === 'overdue') filtered.where('c.review_due_on', '<', d.today);
    else if (d.kind === 'due_soon') filtered.whereBetween('c.review_due_on', [d.today, d.until]);
    else if (d.kind === 'on_track') filtered.where('c.review_due_on', '>', d.after);
    else filtered.where('c.stage', 'waiting_on_dealer');
  }
  if (f.assigned?.kind === 'me') filtered.where('c.assigned_rep_id', f.assigned.userId);
  if (f.assigned?.kind === 'nobody') filtered.whereNull('c.assigned_rep_id');
  if (f.q) {
    const like = `%${f.q.replace(/[%_\\]/g, (m) => `\\${m}`)}%`;
    filtered.where((w) => w.whereILike('c.number', like).orWhereILike('c.frame_serial', like).orWhereILike('c.part_serial', like));
  }
  const count = cappedCount(filtered);
  const pageOf = filtered
    .clone()
    .join('organisations as d', 'd.id', 'c.dealer_id')
    .leftJoin('parts as p', 'p.id', 'c.part_id')
    .leftJoin('bike_models as m', 'm.id', 'c.model_id')
    .leftJoin('users as u', 'u.id', 'c.assigned_rep_id')
    .select(
      'c.id', 'c.number', 'c.stage', 'c.version', 'c.dealer_id as dealerId', 'd.name as dealerName', 'p.part_number as partNumber',
      'p.name as partName', 'c.part_category as partCategory', 'm.name as modelName', 'c.frame_serial as frameSerial',
      'c.submitted_at as submittedAt', 'c.review_started_at as reviewStartedAt', 'c.review_due_on as reviewDueOn',
      'c.assigned_rep_id as assignedRepId', 'u.name as assignedRepName', db().raw(`c.context->>'deniedByRepId' as "deniedByRepId"`),
      db().raw(`coalesce((c.context->>'appealsUsed')::int, 0) as "appealsUsed"`), 'c.updated_at as updatedAt',
    )
    // Claims without a running clock go last by deadline; the other sort columns are never null, and
    // PostgreSQL's default null order lets their indexes be read in either direction.
    .orderBy([{ column: SORT_COLUMNS[sort.by], order: sort.dir, ...(sort.by === 'deadline' ? { nulls: 'last' as const } : {}) }, { column: 'c.id', order: sort.dir }])
    .limit(page.pageSize)
    .offset((page.page - 1) * page.pageSize);
  // The page's clock entries come with it, read only for the page's own rows (after the limit):
  // one round trip instead of a second query per page.
  const events = db()('claim_events as e')
    .select(db().raw(`coalesce(json_agg(json_build_object('event', e.event, 'at', e.created_at) ORDER BY e.id), '[]')`))
    .whereRaw('e.claim_id = pg.id')
    .whereIn('e.event', CLOCK_EVENTS);
  const listed = db()
    .select('pg.*', db().raw(`CASE WHEN pg.stage IN (${CLOCK_STAGES.map(() => '?').join(', ')}) AND pg."reviewStartedAt" IS NOT NULL THEN (?) ELSE '[]' END as "clockEvents"`, [...CLOCK_STAGES, events]))
    .from(pageOf.as('pg'))
    .orderBy([{ column: `pg.${PAGE_SORT_COLUMNS[sort.by]}`, order: sort.dir, ...(sort.by === 'deadline' ? { nulls: 'last' as const } : {}) }, { column: 'pg.id', order: sort.dir }]);
  const [counted, rows] = await Promise.all([count, listed]);
  const iso = (v: unknown) => (v ? new Date(v as string).toISOString() : null);
  return {
    ...counted,
    rows: rows.map((r) => ({
      ...r, submittedAt: iso(r.submittedAt), reviewStartedAt: iso(r.reviewStartedAt), updatedAt: iso(r.updatedAt)!,
      clockEvents: (r.clockEvents as { event: ClockEvent['event']; at: string }[]).map((e) => ({ event: e.event, at: new Date(e.at).toISOString() })),
    })),
  };
}

// ---- the rep's view of one claim ----

export type DealerHistoryCounts = { filed: number; open: number; approved: number; denied: number; withdrawn: number; firstFiledAt: string | null };

/** The dealer's claims with this brand (drafts are the shop's own and not counted). */
export async function dealerHistoryCounts(brandId: string, dealerId: string, q: Knex = db()): Promise<DealerHistoryCounts> {
  const row = await q('claims')
    .where({ brand_id: brandId, dealer_id: dealerId })
    .whereNotNull('submitted_at')
    .first(
      q.raw('count(*)::int as filed'),
      q.raw(`count(*) FILTER (WHERE stage IN ('submitted', 'in_review', 'waiting_on_dealer', 'appealed'))::int as open`),
      q.raw(`count(*) FILTER (WHERE stage IN ('approved', 'credit_pending', 'credited', 'reconciled'))::int as approved`),
      q.raw(`count(*) FILTER (WHERE stage = 'denied')::int as denied`),
      q.raw(`count(*) FILTER (WHERE stage = 'withdrawn')::int as withdrawn`),
      q.raw('min(submitted_at) as "firstFiledAt"'),
    );
  return {
    filed: row?.filed ?? 0, open: row?.open ?? 0, approved: row?.approved ?? 0, denied: row?.denied ?? 0, withdrawn: row?.withdrawn ?? 0,
    firstFiledAt: row?.firstFiledAt ? new Date(row.firstFiledAt).toISOString() : null,
  };
}

export type SameSerialClaim = { id: string; number: string; stage: string; dealerName: string; frameSerial: string; partSerial: string; submittedAt: string | null; matchedOn: ('frame' | 'part')[] };

/** Every other submitted claim against the brand on the same frame serial or part serial. */
export async function claimsOnSameSerials(
  brandId: string,
  serials: { frameSerial: string; partSerial: string },
  excludeId: string,
  q: Knex = db(),
): Promise<SameSerialClaim[]> {
  const rows = await q('claims as c')
    .join('organisations as d', 'd.id', 'c.dealer_id')
    .select('c.id', 'c.number', 'c.stage', 'd.name as dealerName', 'c.frame_serial as frameSerial', 'c.part_serial as partSerial', 'c.submitted_at as submittedAt')
    .where('c.brand_id', brandId)
    .whereNotNull('c.submitted_at')
    .whereNot('c.id', excludeId)
    .where((w) => {
      w.whereRaw('lower(c.frame_serial) = lower(?)', [serials.frameSerial]);
      if (serials.partSerial) w.orWhereRaw(`c.part_serial <> '' AND lower(c.part_serial) = lower(?)`, [serials.partSerial]);
    })
    .orderBy('c.submitted_at', 'desc')
    .limit(20);
  return rows.map((r) => ({
    ...r,
    submittedAt: r.submittedAt ? new Date(r.submittedAt).toISOString() : null,
    matchedOn: [
      ...(r.frameSerial.toLowerCase() === serials.frameSerial.toLowerCase() ? (['frame'] as const) : []),
      ...(serials.partSerial && r.partSerial.toLowerCase() === serials.partSerial.toLowerCase() ? (['part'] as const) : []),
    ],
  }));
}

/** A message already sent under this key (the same submit twice), or null. */
export async function messageWithKey(trx: Knex, claimId: string, clientKey: string): Promise<{ id: number } | null> {
  return (await trx('claim_events').where({ claim_id: claimId, event: 'MESSAGE' }).whereRaw(`payload->>'clientKey' = ?`, [clientKey]).first('id')) ?? null;
}

// ---- deadline reminders ----

export type DeadlineCandidate = { id: string; brandId: string; reviewDueOn: string };

/** Running review clocks due on or before `until` for one brand, that have no reminder for this threshold and deadline yet. */
export async function claimsNeedingReminder(brandId: string, threshold: 'due_soon' | 'overdue', bounds: { from?: string; until: string; before?: boolean }, q: Knex = db()): Promise<DeadlineCandidate[]> {
  const query = q('claims as c')
    .select('c.id', 'c.brand_id as brandId', 'c.review_due_on as reviewDueOn')
    .where('c.brand_id', brandId)
    .whereIn('c.stage', ['submitted', 'in_review', 'appealed'])
    .whereNotNull('c.review_due_on')
    .whereNotExists((s) => s.select(q.raw('1')).from('review_deadline_alerts as a').whereRaw('a.claim_id = c.id AND a.due_on = c.review_due_on').where('a.threshold', threshold))
    .orderBy('c.review_due_on')
    .limit(500);
  if (bounds.before) query.where('c.review_due_on', '<', bounds.until);
  else query.where('c.review_due_on', '<=', bounds.until);
  if (bounds.from) query.where('c.review_due_on', '>=', bounds.from);
  return query;
}

/** Records the reminder; false when it was recorded already (by another run). */
export async function recordReminder(trx: Knex, claimId: string, threshold: 'due_soon' | 'overdue', dueOn: string): Promise<boolean> {
  const rows = await trx('review_deadline_alerts').insert({ claim_id: claimId, threshold, due_on: dueOn }).onConflict(['claim_id', 'threshold', 'due_on']).ignore().returning('claim_id');
  return rows.length === 1;
}

export async function brandsWithOpenReviews(q: Knex = db()): Promise<string[]> {
  const rows = await q('claims').distinct('brand_id').whereIn('stage', ['submitted', 'in_review', 'appealed']).whereNotNull('review_due_on');
  return rows.map((r) => r.brand_id as string);
}

/** The transaction's own clock: the time the event log and the claim's timestamps get. */
export async function transactionNow(trx: Knex): Promise<string> {
  const { rows } = await trx.raw('SELECT now() AS now');
  return new Date(rows[0].now).toISOString();
}
