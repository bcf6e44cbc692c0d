import 'server-only';
import { findPart, findRegisteredUnit, listLaborOperations } from '@/lib/db/catalog';
import { appealDaysFor, claimsOnSameSerials, dealerHistoryCounts, otherActiveReps, userNames } from '@/lib/db/review';
import type { AppUser } from '@/lib/db/users';
import type { CurrencyCode } from '@/lib/money';
import { appealOf, approvalRateText, compareLines, DEFAULT_APPEAL_DAYS, draftFromRequest, sinceLastRequest } from '@/lib/review';
import type { ClaimView } from '@/lib/services/claim-view';
import { reviewClockFor } from '@/lib/services/review-clock';

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
    // Shown while the appeal is open: from the appeal until the next decision.
    appeal: ['appealed', 'in_review', 'waiting_on_dealer'].includes(claim.stage) && ctx.appealsUsed > 0 ? appealOf(view.events) : null,
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

