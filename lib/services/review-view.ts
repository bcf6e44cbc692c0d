import 'server-only';
import { findPart, findRegisteredUnit, listLaborOperations } from '@/lib/db/catalog';
import type { ClaimEventRow } from '@/lib/db/claims';
import { appealDaysFor, claimsOnSameSerials, dealerHistoryCounts, otherActiveReps, userNames } from '@/lib/db/review';
import type { AppUser } from '@/lib/db/users';
import type { CurrencyCode } from '@/lib/money';
import { approvalRateText, compareLines, DEFAULT_APPEAL_DAYS, draftFromRequest } from '@/lib/review';
import type { ClaimView } from '@/lib/services/claim-view';
import { reviewClockFor } from '@/lib/services/review-clock';

export type SinceRequest = {
  askedAt: string;
  askedBy: string | null;
  checklist: string[];
  message: string | null;
  /** Attachments added after the request, by id. */
  attachmentIds: string[];
  /** Messages written after the request, the resubmission's included. */
  messages: { id: number; by: string | null; role: string; at: string; text: string }[];
  resubmittedAt: string | null;
};

/** What changed since the last request for more: the evidence and messages that came after it. */
export function sinceLastRequest(events: ClaimEventRow[]): SinceRequest | null {
  const lastIndex = events.map((e) => e.event).lastIndexOf('REQUEST_INFO');
  if (lastIndex < 0) return null;
  const ask = events[lastIndex]!;
  const after = events.slice(lastIndex + 1);
  const resubmit = after.find((e) => e.event === 'RESUBMIT') ?? null;
  // Only what the dealer did until the next decision belongs to this answer.
  const end = after.findIndex((e) => ['APPROVE', 'DENY', 'REQUEST_INFO', 'WITHDRAW'].includes(e.event));
  const window = end < 0 ? after : after.slice(0, end);
  return {
    askedAt: new Date(ask.createdAt).toISOString(),
    askedBy: ask.actorName,
    checklist: Array.isArray(ask.payload.checklist) ? (ask.payload.checklist as string[]) : [],
    message: typeof ask.payload.message === 'string' ? ask.payload.message : null,
    attachmentIds: window.filter((e) => e.event === 'EVIDENCE_ADDED').map((e) => String(e.payload.attachmentId)),
    messages: window
      .filter((e) => typeof e.payload.message === 'string' && e.payload.message && (e.event === 'MESSAGE' || e.event === 'RESUBMIT'))
      .map((e) => ({ id: e.id, by: e.actorName, role: e.actorRole, at: new Date(e.createdAt).toISOString(), text: String(e.payload.message) })),
    resubmittedAt: resubmit ? new Date(resubmit.createdAt).toISOString() : null,
  };
}

/** Everything a brand rep needs beside the claim to decide it. */
export async function loadRepReview(user: AppUser, view: ClaimView) {
  const { claim } = view;
  const ctx = claim.context;
  const [clock, counts, sameSerial, unit, part, schedule, others, appealDays, names] = await Promise.all([
    reviewClockFor(claim),
    dealerHistoryCounts(claim.brandId, claim.dealerId),
    claimsOnSameSerials(claim.brandId, { frameSerial: claim.frameSerial, partSerial: claim.partSerial }, claim.id),
    findRegisteredUnit(claim.brandId, claim.frameSerial),
    claim.partId ? findPart(claim.brandId, claim.partId) : Promise.resolve(null),
    listLaborOperations(claim.brandId),
    otherActiveReps(claim.brandId, user.id),
    appealDaysFor(claim.brandId, claim.partCategory),
    userNames([ctx.assignedRepId ?? '', ctx.deniedByRepId ?? '']),
  ]);
  const registeredSerial = unit && claim.partCategory ? (unit.componentSerials[claim.partCategory] ?? null) : null;
  const deniedByMe = ctx.appealsUsed > 0 && ctx.deniedByRepId === user.id;
  const canTake = view.allowed.includes('TAKE') || (claim.stage === 'appealed' && deniedByMe && others.length === 0);
  return {
    clock,
    history: { ...counts, rateText: approvalRateText(counts) },
    sameSerial,
    registry: unit ? { modelName: unit.modelName, saleDate: unit.retailSaleDate, componentSerial: registeredSerial } : null,
    part,
    schedule: schedule.map((o) => ({ id: o.id, code: o.code, description: o.description, standardHours: o.standardHours, active: o.active })),
    approvalDraft: draftFromRequest(claim.requestedLines, claim.currency as CurrencyCode),
    since: sinceLastRequest(view.events),
    assignedRepName: ctx.assignedRepId ? (names.get(ctx.assignedRepId) ?? 'another rep') : null,
    assignedToMe: ctx.assignedRepId === user.id,
    deniedByName: ctx.deniedByRepId ? (names.get(ctx.deniedByRepId) ?? null) : null,
    deniedByMe,
    otherRepCount: others.length,
    appealDays: appealDays ?? DEFAULT_APPEAL_DAYS,
    canTake,
    canRelease: view.allowed.includes('RELEASE'),
    canDecide: view.allowed.includes('APPROVE'),
  };
}
export type RepReview = Awaited<ReturnType<typeof loadRepReview>>;

/** What the dealer sees of the review: the deadline, the rep's questions, the decision. */
export async function loadDealerReview(view: ClaimView) {
  const { claim } = view;
  const ctx = claim.context;
  const clock = await reviewClockFor(claim);
  return {
    clock,
    since: sinceLastRequest(view.events),
    decision: ctx.decision,
    appealOpenUntil: ctx.appealOpenUntil,
    appealsUsed: ctx.appealsUsed,
    comparison: claim.approvedLines ? compareLines(claim.requestedLines, claim.approvedLines) : null,
    canResubmit: view.allowed.includes('RESUBMIT'),
    canAppeal: view.allowed.includes('APPEAL'),
  };
}
export type DealerReview = Awaited<ReturnType<typeof loadDealerReview>>;

export type ThreadEntry = { id: number; event: string; by: string | null; role: string; at: string; text: string };

/** The claim's thread: every log entry that carries a message, oldest first. */
export function threadOf(events: ClaimEventRow[]): ThreadEntry[] {
  return events
    .filter((e) => typeof e.payload.message === 'string' && (e.payload.message as string).trim() !== '')
    .map((e) => ({ id: e.id, event: e.event, by: e.actorName, role: e.actorRole, at: new Date(e.createdAt).toISOString(), text: String(e.payload.message) }));
}
