import 'server-only';
import { db } from '@/db/connection';
import { DEALER_ROLES } from '@/lib/auth/roles';
import { organisationTimeZone } from '@/lib/db/organisations';
import { formatDateTime } from '@/lib/format/dates';
import { formatRmaNumber } from '@/lib/credits';
import { listLaborOperations } from '@/lib/db/catalog';
import { findClaimForUser, nextBrandSequence } from '@/lib/db/claims';
import { appealDaysFor, messageWithKey, otherActiveReps, transactionNow } from '@/lib/db/review';
import { dueOnWith, startedAtOf } from '@/lib/services/review-clock';
import type { AppUser } from '@/lib/db/users';
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '@/lib/errors';
import type { CurrencyCode } from '@/lib/money';
import { appealWindowEnd, buildApproval, checklistFrom, describeChange, type ApprovalOutcome, type RequestItemKey } from '@/lib/review';
import { applyStep, logClaimNote, type StepContext, type StepOutcome } from '@/lib/services/claim-steps';
import { notifyBrandRole, notifyDealer } from '@/lib/services/claim-notify';
import { evidenceSummaryFor } from '@/lib/services/claims';
import type { ApproveRequest, RequestInfoRequest } from '@/lib/validation/review';
import { allowedEvents, DENIAL_REASON_LABELS, restoreClaim, type ClaimEventType, type DenialReason } from '@/machines/claim';
import { nothingShipsText } from '@/lib/fulfilment';

type Version = number | undefined;

/** Whether the machine would let this user take the step now, whatever its data; used to put state refusals (409) before data refusals (422). */
function stepOpen(ctx: StepContext, type: ClaimEventType): boolean {
  if ((ctx.user as { kind?: string }).kind === 'system') return false;
  const user = ctx.user as AppUser;
  const snapshot = restoreClaim({ value: ctx.claim.stateValue, context: ctx.claim.context });
  return allowedEvents(snapshot, { id: user.id, role: user.role }, { at: ctx.at }).includes(type);
}

// ---- taking and releasing ----

export async function takeClaim(user: AppUser, claimId: string, version: Version): Promise<StepOutcome> {
  return applyStep(user, claimId, 'TAKE', {}, {
    expectedVersion: version,
    prepare: async ({ trx, claim }) => {
      // The rep who denied may review the appeal only when the brand has no other rep.
      if (claim.context.appealsUsed > 0 && claim.context.deniedByRepId === user.id) {
        const others = await otherActiveReps(claim.brandId, user.id, trx);
        if (others.length === 0) return { noOtherRep: true };
      }
      return {};
    },
  });
}

export async function releaseClaim(user: AppUser, claimId: string, note: string | undefined, version: Version): Promise<StepOutcome> {
  return applyStep(user, claimId, 'RELEASE', note ? { note } : {}, { expectedVersion: version });
}

// ---- asking for more ----

export async function requestInfo(user: AppUser, claimId: string, input: RequestInfoRequest, version: Version): Promise<StepOutcome> {
  const built = checklistFrom(input.items.map((i) => ({ key: i.key as RequestItemKey, detail: i.detail })));
  if (!built.ok) throw new ValidationError(built.message, { [built.field]: [built.message] });
  const { checklist } = built;
  return applyStep(user, claimId, 'REQUEST_INFO', { checklist, message: input.message }, {
    expectedVersion: version,
    columns: () => ({ review_due_on: null }),
    after: async ({ trx, claim }) => {
      await notifyDealer(trx, claim, {
        kind: 'more_requested',
        title: `${claim.brandName} needs more on claim ${claim.number}`,
        body: `Please send: ${checklist.join('; ')}. “${input.message}” The review deadline is paused until you send the requested items.`,
      });
    },
  });
}

export async function resubmitClaim(user: AppUser, claimId: string, message: string | undefined, version: Version): Promise<StepOutcome> {
  return applyStep(user, claimId, 'RESUBMIT', {}, {
    expectedVersion: version,
    prepare: async ({ trx, claim }) => ({ evidence: await evidenceSummaryFor(claim, trx), ...(message ? { message } : {}) }),
    columns: async ({ trx, claim }) => {
      const started = (await startedAtOf(trx, claim.id)) ?? (await transactionNow(trx));
      return { review_due_on: await dueOnWith(trx, claim, started, 'RESUBMIT') };
    },
    after: async ({ trx, claim }) => {
      await notifyBrandRole(trx, claim, 'brand_rep', {
        kind: 'resubmitted',
        title: `${claim.dealerName} sent what you asked for on claim ${claim.number}`,
        body: message ? `“${message}” The review clock runs again.` : 'The review clock runs again.',
        onlyAssigned: true,
      });
    },
  });
}

// ---- deciding ----

export async function approveClaim(user: AppUser, claimId: string, input: ApproveRequest, version: Version): Promise<StepOutcome> {
  let outcome: Extract<ApprovalOutcome, { ok: true }> | null = null;
  return applyStep(user, claimId, 'APPROVE', {}, {
    expectedVersion: version,
    prepare: async (ctx) => {
      // Not the assigned rep, or not in review: let the machine refuse it (409) before the lines are judged.
      if (!stepOpen(ctx, 'APPROVE')) return {};
      const { trx, claim } = ctx;
      const schedule = await listLaborOperations(claim.brandId, trx);
      const built = buildApproval(claim.requestedLines, { parts: input.parts, labor: input.labor, freight: input.freight }, schedule, claim.currency as CurrencyCode);
      if (!built.ok) throw new ValidationError(built.message, built.fieldErrors);
      outcome = built;
      const year = new Date(ctx.at).getUTCFullYear();
      // Inside the step's transaction: a refused approval gives its number back.
      const rmaNumber = formatRmaNumber({ year, sequence: await nextBrandSequence(trx, claim.brandId, 'rma', year) });
      const nothingToShip = !built.approved.parts.some((p) => p.quantity > 0 && !p.fromDealerStock);
      return { extent: built.extent, lines: built.lines, rmaNumber, nothingToShip, ...(input.message ? { message: input.message } : {}) };
    },
    columns: (_ctx, next) => ({
      rma_number: next.context.rmaNumber,
      approved_lines: JSON.stringify(outcome!.approved),
      review_due_on: null,
    }),
    after: async ({ trx, claim }, next) => {
      const changes = outcome!.comparison.map((c) => describeChange(c, claim.currency as CurrencyCode)).filter((c): c is string => !!c);
      const partial = outcome!.extent === 'partial';
      await notifyDealer(trx, claim, {
        kind: 'approved',
        title: `Claim ${claim.number} approved${partial ? ' in part' : ''}: RMA ${next.context.rmaNumber}`,
        body: [
          partial ? `Changed from your request: ${changes.join('; ')}.` : 'Approved as requested.',
          input.message ? `“${input.message}”` : '',
          next.context.replacement.fromShopStock
            ? `${nothingShipsText(outcome!.approved.parts, 'dealer')} Upload the after-test on the claim to release the labor credit, and keep the failed part for its return under RMA ${next.context.rmaNumber}.`
            : `The replacement ships under RMA ${next.context.rmaNumber}; keep the failed part for its return.`,
        ].filter(Boolean).join(' '),
      });
    },
  });
}

export async function denyClaim(user: AppUser, claimId: string, input: { reasonCode: DenialReason; message: string }, version: Version): Promise<StepOutcome> {
  return applyStep(user, claimId, 'DENY', { reasonCode: input.reasonCode, message: input.message }, {
    expectedVersion: version,
    prepare: async ({ trx, claim, at }) => ({ appealOpenUntil: appealWindowEnd(at, await appealDaysFor(claim.brandId, claim.partCategory, trx)) }),
    columns: () => ({ review_due_on: null }),
    after: async ({ trx, claim }, next) => {
      // Said in the shop's own time, to the minute: a bare UTC date would read a day late in the evening west of Greenwich.
      const tz = await organisationTimeZone(claim.dealerId, trx);
      const until = next.context.appealOpenUntil ? `${formatDateTime(next.context.appealOpenUntil, tz)} (${tz} time)` : null;
      await notifyDealer(trx, claim, {
        kind: 'denied',
        title: `Claim ${claim.number} denied: ${DENIAL_REASON_LABELS[input.reasonCode].toLowerCase()}`,
        body: `“${input.message}”${until ? ` You may appeal once, with a message and new evidence, until ${until}.` : ''}`,
      });
    },
  });
}

export async function appealClaim(user: AppUser, claimId: string, message: string, version: Version): Promise<StepOutcome> {
  return applyStep(user, claimId, 'APPEAL', { message }, {
    expectedVersion: version,
    columns: async ({ trx, claim }) => {
      const now = await transactionNow(trx);
      return { review_started_at: trx.fn.now(), review_due_on: await dueOnWith(trx, claim, now, null) };
    },
    after: async ({ trx, claim }) => {
      const denier = claim.context.deniedByRepId;
      await notifyBrandRole(trx, claim, 'brand_rep', {
        kind: 'appealed',
        title: `${claim.dealerName} appealed the denial of claim ${claim.number}`,
        body: `“${message}” A rep other than the one who denied it reviews the appeal.`,
        exclude: denier ? [denier] : [],
      });
    },
  });
}

// ---- messages ----

const MESSAGE_CLOSED = new Set(['draft', 'withdrawn']);

/**
 * A message in the claim's thread between the shop and the brand: one event in the log, and a
 * notification to the other side. The same form sent twice (same key) is one message.
 */
export async function postMessage(user: AppUser, claimId: string, input: { message: string; clientKey?: string }): Promise<{ duplicate: boolean }> {
  const fromDealer = (DEALER_ROLES as readonly string[]).includes(user.role);
  if (!fromDealer && user.role !== 'brand_rep') throw new ForbiddenError('Only the dealer and the brand’s reps write in a claim’s thread.');
  return db().transaction(async (trx) => {
    const claim = await findClaimForUser(user, claimId, trx, true);
    if (!claim) throw new NotFoundError('No such claim.');
    if (MESSAGE_CLOSED.has(claim.stage)) {
      throw new ConflictError(claim.stage === 'draft' ? 'Messages start once the claim is submitted.' : 'This claim was withdrawn; its thread is closed.', { stage: claim.stage });
    }
    if (input.clientKey && (await messageWithKey(trx, claim.id, input.clientKey))) return { duplicate: true };
    await logClaimNote(trx, user, claim, 'MESSAGE', { message: input.message, ...(input.clientKey ? { clientKey: input.clientKey } : {}) });
    const preview = input.message.length > 280 ? `${input.message.slice(0, 277)}…` : input.message;
    if (fromDealer) {
      await notifyBrandRole(trx, claim, 'brand_rep', { kind: 'message', title: `Message from ${claim.dealerName} on claim ${claim.number}`, body: `“${preview}”`, onlyAssigned: true });
    } else {
      await notifyDealer(trx, claim, { kind: 'message', title: `Message from ${claim.brandName} on claim ${claim.number}`, body: `“${preview}”` });
    }
    return { duplicate: false };
  });
}
