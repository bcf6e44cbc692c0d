import 'server-only';
import { db } from '@/db/connection';
import { parseDocumentNumber } from '@/lib/credits';
import { localDate } from '@/lib/calendar';
import { findClaimIdByRma, listReturns, listToShip, organisationAddress } from '@/lib/db/fulfilment';
import { adjustStock, findStockPart, setRestockDate, stockLevelsFor } from '@/lib/db/stock';
import type { AppUser } from '@/lib/db/users';
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '@/lib/errors';
import { ADJUSTMENT_REASON_LABELS, adjustmentProblem, lineAvailability, linesToShip } from '@/lib/fulfilment';
import { restockDateSchema, stockAdjustmentSchema, type ReturnsQuery, type ToShipQuery } from '@/lib/validation/fulfilment';

function brandOnly(user: AppUser) {
  if (user.orgKind !== 'brand') throw new ForbiddenError('Only the brand’s warehouse works from these queues.');
}

/** One page of the to-ship queue, each line with its stock standing (in stock or back-ordered, expected when). */
export async function toShipPage(user: AppUser, query: ToShipQuery) {
  brandOnly(user);
  const page = await listToShip(user, query);
  const partIds = [...new Set(page.rows.flatMap((r) => r.parts.map((p) => p.partId)))];
  const stock = await stockLevelsFor(user.organisationId, partIds);
  return {
    total: page.total,
    rows: page.rows.map((r) => ({ ...r, availability: lineAvailability(linesToShip(r.parts), stock) })),
  };
}

export async function returnsPage(user: AppUser, query: ReturnsQuery) {
  brandOnly(user);
  const brand = await organisationAddress(user.organisationId);
  return listReturns(user, query, localDate(new Date().toISOString(), brand?.timeZone ?? 'UTC'));
}

/**
 * Finds a claim of the caller's brand by its RMA number, typed or scanned. A mistyped number is
 * a clear 422; a number of another kind or of another brand is simply not found here.
 */
export async function findByRma(user: AppUser, text: string) {
  brandOnly(user);
  const parsed = parseDocumentNumber(text);
  if (!parsed.ok) throw new ValidationError(parsed.message, { rma: [parsed.message] });
  if (parsed.kind !== 'rma') {
    const m = `${parsed.canonical} is a ${parsed.kind === 'claim' ? 'claim' : 'credit memo'} number; scan the RMA number on the packing slip or label.`;
    throw new ValidationError(m, { rma: [m] });
  }
  const found = await findClaimIdByRma(user, parsed.canonical);
  if (!found) throw new NotFoundError(`No claim of ${user.orgName} has RMA ${parsed.canonical}.`);
  return { claimId: found.id, claimNumber: found.number, rmaNumber: parsed.canonical, coreStep: found.coreStep, stage: found.stage };
}

export async function adjustPartStock(user: AppUser, partId: string, body: unknown) {
  const input = stockAdjustmentSchema.parse(body);
  const problem = adjustmentProblem(input.reason, input.delta, input.note);
  if (problem) throw new ValidationError(problem, { delta: [problem] });
  return db().transaction(async (trx) => {
    const part = await findStockPart(user.organisationId, partId, trx);
    if (!part) throw new NotFoundError('No such part in your catalog.');
    if (input.expectedOnHand !== undefined && input.expectedOnHand !== part.onHand) {
      throw new ConflictError(`${part.partNumber} now shows ${part.onHand} on hand, not ${input.expectedOnHand}: someone changed it (or this change was already saved). Nothing was changed; check the level and enter the change again.`, { onHand: part.onHand });
    }
    const after = await adjustStock(trx, { brandId: user.organisationId, partId, delta: input.delta, reason: input.reason, note: input.note, userId: user.id, expectedOnHand: input.expectedOnHand });
    if (after === null && input.expectedOnHand !== undefined) {
      throw new ConflictError(`${part.partNumber} changed while saving; nothing was changed. Check the level and enter the change again.`, { onHand: part.onHand });
    }
    if (after === null) {
      throw new ConflictError(`Only ${part.onHand} of ${part.partNumber} on hand; removing ${-input.delta} would go below zero. Nothing was changed.`, { onHand: part.onHand });
    }
    return { partId, partNumber: part.partNumber, onHand: after, reason: ADJUSTMENT_REASON_LABELS[input.reason] };
  });
}

export async function setPartRestockDate(user: AppUser, partId: string, body: unknown) {
  const input = restockDateSchema.parse(body);
  return db().transaction(async (trx) => {
    const part = await findStockPart(user.organisationId, partId, trx);
    if (!part) throw new NotFoundError('No such part in your catalog.');
    await setRestockDate(trx, { brandId: user.organisationId, partId, expectedOn: input.expectedOn, note: input.note, userId: user.id });
    return { partId, partNumber: part.partNumber, restockExpectedOn: input.expectedOn };
  });
}
