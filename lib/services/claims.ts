import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import { localDate } from '@/lib/calendar';
import { missingDetails } from '@/lib/claims/completeness';
import { missingEvidence, type EvidenceSummary } from '@/lib/claims/evidence';
import { formatClaimNumber } from '@/lib/credits';
import { evidenceCounts } from '@/lib/db/attachments';
import { findModel, findPart, findRegisteredUnit, listLaborOperations } from '@/lib/db/catalog';
import { findClaimForUser, findDraftByClientKey, insertClaim, insertEvent, nextClaimSequence, openClaimsOnSerial, updateDraftClaim, type ClaimRecord, type ClaimRowInput, type RequestedLines } from '@/lib/db/claims';
import { findDealerAccount } from '@/lib/db/dealer-accounts';
import { countAnalysedRuns } from '@/lib/db/load-tests';
import type { AppUser } from '@/lib/db/users';
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '@/lib/errors';
import { parseAmount, type CurrencyCode } from '@/lib/money';
import { applyStep, type StepOutcome } from '@/lib/services/claim-steps';
import { notifyBrandRole } from '@/lib/services/claim-notify';
import { reviewColumnsOnSubmit } from '@/lib/services/review-clock';
import type { ClaimDraftInput } from '@/lib/validation/claims';
import { initialClaimSnapshot } from '@/machines/claim';

const isDealer = (u: AppUser) => u.orgKind === 'dealer';

/** Turns the dealer's form into claim columns, checking every id against the brand's own catalog. */
async function resolveDraft(user: AppUser, input: ClaimDraftInput, q: Knex): Promise<ClaimRowInput> {
  const account = await findDealerAccount(user.organisationId, input.brandId, q);
  if (!account) throw new ValidationError('Your shop has no account with that brand.', { brandId: ['Choose one of the brands your shop sells.'] });

  const unit = await findRegisteredUnit(input.brandId, input.frameSerial, q);
  const modelId = unit?.modelId ?? input.modelId ?? null;
  if (modelId && !(await findModel(input.brandId, modelId, q))) throw new ValidationError('Unknown model.', { modelId: ['Choose a model of this brand.'] });

  const part = input.partId ? await findPart(input.brandId, input.partId, q) : null;
  if (input.partId && !part) throw new ValidationError('Unknown part.', { partId: ['Choose a part of this brand.'] });

  const today = localDate(new Date().toISOString(), user.timeZone);
  if (input.failureDate && input.failureDate > today) {
    throw new ValidationError('The failure date is in the future.', { failureDate: [`Today is ${today} where you are; the failure cannot be later.`] });
  }
  // A registered sale date is the brand's record; the dealer's date applies only without one.
  const saleDate = unit?.retailSaleDate ?? input.saleDate ?? null;
  if (saleDate && input.failureDate && saleDate > input.failureDate) {
    throw new ValidationError('The sale date is after the failure date.', {
      failureDate: [`The bike was sold on ${saleDate}; the failure date cannot be earlier.`],
    });
  }

  const parts: RequestedLines['parts'] = [];
  for (const [i, p] of input.parts.entries()) {
    const found = await findPart(input.brandId, p.partId, q);
    if (!found) throw new ValidationError('Unknown replacement part.', { [`parts.${i}.partId`]: ['Choose a part of this brand.'] });
    parts.push({ lineId: `p${i + 1}`, partId: found.id, partNumber: found.partNumber, name: found.name, quantity: p.quantity, fromDealerStock: p.fromDealerStock });
  }
  const ops = await listLaborOperations(input.brandId, q);
  const labor: RequestedLines['labor'] = [];
  for (const [i, l] of input.labor.entries()) {
    const op = ops.find((o) => o.id === l.operationId);
    if (!op) throw new ValidationError('Unknown labor operation.', { [`labor.${i}.operationId`]: ['Choose an operation from this brand’s schedule.'] });
    labor.push({ lineId: `l${i + 1}`, operationId: op.id, code: op.code, description: op.description, hours: op.standardHours });
  }
  let freightMinor = 0;
  if (input.freight) {
    const parsed = parseAmount(input.freight.replace(',', '.'), { currency: account.currency as CurrencyCode });
    if (!parsed.ok || parsed.value < 0) throw new ValidationError('Freight is not an amount.', { freight: ['Freight as an amount, like 18.50.'] });
    freightMinor = parsed.value;
  }

  return {
    dealerId: user.organisationId, brandId: input.brandId, dealerAccountId: account.id, modelId,
    registeredUnitId: unit?.id ?? null, frameSerial: unit?.frameSerial ?? input.frameSerial, partId: part?.id ?? null,
    partCategory: part?.category ?? null, partSerial: input.partSerial, saleDate, failureDate: input.failureDate ?? null,
    odometerKm: input.odometerKm ?? null, batteryCycles: input.batteryCycles ?? null, symptom: input.symptom,
    errorCodes: input.errorCodes, description: input.description, customerName: input.customerName,
    customerEmail: input.customerEmail, customerPhone: input.customerPhone,
    requestedLines: { parts, labor, freightMinor },
  };
}

export async function createDraft(user: AppUser, input: ClaimDraftInput): Promise<{ id: string; number: string }> {
  if (!isDealer(user)) throw new ForbiddenError('Only a dealer files claims.');
  if (input.clientKey) {
    const made = await findDraftByClientKey(user.organisationId, input.clientKey);
    if (made) return made;
  }
  try {
    return await db().transaction(async (trx) => {
      const row = await resolveDraft(user, input, trx);
      const year = new Date().getUTCFullYear();
      const number = formatClaimNumber({ year, sequence: await nextClaimSequence(trx, year) });
      const at = new Date().toISOString();
      const initial = initialClaimSnapshot({ openedBy: { id: user.id, role: user.role }, openedAt: at });
      const id = await insertClaim(trx, { ...row, number, stateValue: initial.value, context: initial.context, createdBy: user.id, clientKey: input.clientKey });
      await insertEvent(trx, { claimId: id, actorId: user.id, actorRole: user.role, event: 'OPENED', fromState: null, toState: initial.value, payload: { number } });
      return { id, number };
    });
  } catch (err) {
    // Two requests with one key at the same moment: the second finds the first's draft.
    if (input.clientKey && (err as { constraint?: string }).constraint === 'claims_client_key') {
      const made = await findDraftByClientKey(user.organisationId, input.clientKey);
      if (made) return made;
    }
    throw err;
  }
}

export async function updateDraft(user: AppUser, claimId: string, version: number, input: ClaimDraftInput): Promise<void> {
  if (!isDealer(user)) throw new ForbiddenError('Only the dealer edits a claim’s details.');
  await db().transaction(async (trx) => {
    const claim = await findClaimForUser(user, claimId, trx, true);
    if (!claim) throw new NotFoundError('No such claim.');
    if (claim.stage !== 'draft') throw new ConflictError('Only a draft can be edited; this claim has gone to the brand.', { stage: claim.stage, version: claim.version });
    if (claim.brandId !== input.brandId) throw new ValidationError('The brand of a claim cannot change.', { brandId: ['Start a new claim for another brand.'] });
    if (claim.version !== version) throw new ConflictError('This claim changed since you opened it; reload to see the latest.', { stage: claim.stage, version: claim.version });
    const row = await resolveDraft(user, input, trx);
    if (!(await updateDraftClaim(trx, claimId, version, row))) throw new ConflictError('This claim changed at the same moment; nothing was saved.');
  });
}

export async function evidenceSummaryFor(claim: Pick<ClaimRecord, 'id' | 'registeredUnitId' | 'partNumber'>, q: Knex = db()): Promise<EvidenceSummary> {
  const c = await evidenceCounts(claim.id, q);
  const serialLabelPhotos = c.serial_label_photo ?? 0;
  return {
    photos: (c.photo ?? 0) + serialLabelPhotos,
    serialLabelPhotos,
    // Only a before-test that analysed counts, judged against the part the claim now names (the
    // failed part can still change in a draft); a load-test file is recorded only with its analysis.
    beforeTests: await countAnalysedRuns(claim.id, 'before', q, claim.partNumber),
    proofOfPurchase: (c.proof_of_purchase ?? 0) > 0,
    registered: claim.registeredUnitId !== null,
  };
}

/** Everything standing between a draft and submission, in the dealer's words. */
export async function readinessOf(claim: ClaimRecord, q: Knex = db()): Promise<{ missing: string[]; evidence: EvidenceSummary }> {
  const evidence = await evidenceSummaryFor(claim, q);
  const details = missingDetails({
    partId: claim.partId, failureDate: claim.failureDate, symptom: claim.symptom, saleDate: claim.saleDate,
    registered: claim.registeredUnitId !== null, modelId: claim.modelId, partCategory: claim.partCategory,
    batteryCycles: claim.batteryCycles, requestedParts: claim.requestedLines.parts.length,
  });
  return { missing: [...details, ...missingEvidence(evidence)], evidence };
}

export async function submitClaim(user: AppUser, claimId: string, expectedVersion?: number): Promise<StepOutcome> {
  return applyStep(user, claimId, 'SUBMIT', {}, {
    expectedVersion,
    prepare: async ({ trx, claim }) => {
      const { missing, evidence } = await readinessOf(claim, trx);
      // Details and evidence are listed together; the machine's evidence guard stays the backstop.
      if (claim.stage === 'draft' && missing.length) {
        throw new ValidationError(`This claim cannot go to the brand yet. Missing: ${missing.map(lower).join('; ')}.`, { _form: missing });
      }
      return { evidence };
    },
    columns: async ({ trx, claim }) => ({ submitted_at: db().fn.now(), ...(await reviewColumnsOnSubmit(trx, claim)) }),
    after: async ({ trx, claim }) => {
      await notifyBrandRole(trx, claim, 'brand_rep', {
        kind: 'claim_submitted',
        title: `New claim ${claim.number} from ${claim.dealerName}`,
        body: `${claim.partName ?? 'A part'} on ${claim.modelName ?? 'a bike'} (frame ${claim.frameSerial}). Waiting for a rep to take it.`,
      });
    },
  });
}

const lower = (s: string) => s.charAt(0).toLowerCase() + s.slice(1);

export async function withdrawClaim(user: AppUser, claimId: string, note: string | undefined, expectedVersion?: number): Promise<StepOutcome> {
  return applyStep(user, claimId, 'WITHDRAW', note ? { note } : {}, {
    expectedVersion,
    columns: () => ({ review_due_on: null }),
    after: async ({ trx, claim }) => {
      if (claim.stage === 'draft') return;
      await notifyBrandRole(trx, claim, 'brand_rep', {
        kind: 'claim_withdrawn',
        title: `Claim ${claim.number} withdrawn`,
        body: `${claim.dealerName} withdrew the claim${note ? `: “${note}”` : '.'}`,
        onlyAssigned: true,
      });
    },
  });
}

export async function serialWarnings(user: AppUser, claim: ClaimRecord) {
  const open = await openClaimsOnSerial(
    claim.brandId,
    { frameSerial: claim.frameSerial, partSerial: claim.partSerial || undefined },
    { dealerId: user.orgKind === 'dealer' ? user.organisationId : null },
    claim.id,
  );
  // A dealer may only follow links to its own shop's claims; another shop's are counted, and
  // nothing that identifies them (number, id, shop) leaves this function.
  return open.map((o) =>
    user.orgKind === 'brand' || o.dealerId === user.organisationId
      ? { ...o, visible: true }
      : { id: null, number: null, stage: o.stage, dealerId: null, visible: false },
  );
}
