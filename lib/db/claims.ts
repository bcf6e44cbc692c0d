import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import type { AppUser } from '@/lib/db/users';
import type { ClaimContext, ClaimStateValue } from '@/machines/claim';

export type RequestedPart = { lineId: string; partId: string; partNumber: string; name: string; quantity: number; fromDealerStock: boolean };
export type RequestedLabor = { lineId: string; operationId: string; code: string; description: string; hours: string };
export type RequestedLines = { parts: RequestedPart[]; labor: RequestedLabor[]; freightMinor: number };

export type ClaimRecord = {
  id: string;
  number: string;
  dealerId: string;
  dealerName: string;
  brandId: string;
  brandName: string;
  currency: string;
  dealerAccountId: string;
  accountNumber: string;
  modelId: string | null;
  modelName: string | null;
  legalClass: string | null;
  tyreSize: string | null;
  registeredUnitId: string | null;
  frameSerial: string;
  partId: string | null;
  partNumber: string | null;
  partName: string | null;
  partCategory: string | null;
  partSerial: string;
  saleDate: string | null;
  failureDate: string | null;
  odometerKm: number | null;
  batteryCycles: number | null;
  symptom: string;
  errorCodes: string;
  description: string;
  customerName: string;
  customerEmail: string;
  customerPhone: string;
  requestedLines: RequestedLines;
  approvedLines: RequestedLines | null;
  stateValue: ClaimStateValue;
  context: ClaimContext;
  stage: string;
  replacementStep: string | null;
  coreStep: string | null;
  assignedRepId: string | null;
  version: number;
  rmaNumber: string | null;
  reviewDueOn: string | null;
  createdBy: string;
  createdAt: Date;
  updatedAt: Date;
  submittedAt: Date | null;
};

const claimColumns = [
  'c.id', 'c.number', 'c.dealer_id as dealerId', 'd.name as dealerName', 'c.brand_id as brandId', 'b.name as brandName',
  'b.currency', 'c.dealer_account_id as dealerAccountId', 'a.account_number as accountNumber', 'c.model_id as modelId',
  'm.name as modelName', 'm.legal_class as legalClass', 'm.tyre_size as tyreSize', 'c.registered_unit_id as registeredUnitId',
  'c.frame_serial as frameSerial', 'c.part_id as partId', 'p.part_number as partNumber', 'p.name as partName',
  'c.part_category as partCategory', 'c.part_serial as partSerial', 'c.sale_date as saleDate', 'c.failure_date as failureDate',
  'c.odometer_km as odometerKm', 'c.battery_cycles as batteryCycles', 'c.symptom', 'c.error_codes as errorCodes',
  'c.description', 'c.customer_name as customerName', 'c.customer_email as customerEmail', 'c.customer_phone as customerPhone',
  'c.requested_lines as requestedLines', 'c.approved_lines as approvedLines', 'c.state_value as stateValue', 'c.context',
  'c.stage', 'c.replacement_step as replacementStep', 'c.core_step as coreStep', 'c.assigned_rep_id as assignedRepId',
  'c.version', 'c.rma_number as rmaNumber', 'c.review_due_on as reviewDueOn', 'c.created_by as createdBy',
  'c.created_at as createdAt', 'c.updated_at as updatedAt', 'c.submitted_at as submittedAt',
];

function claimBase(q: Knex) {
  return q('claims as c')
    .join('organisations as d', 'd.id', 'c.dealer_id')
    .join('organisations as b', 'b.id', 'c.brand_id')
    .join('dealer_accounts as a', 'a.id', 'c.dealer_account_id')
    .leftJoin('bike_models as m', 'm.id', 'c.model_id')
    .leftJoin('parts as p', 'p.id', 'c.part_id');
}

function toClaim(r: Record<string, unknown>): ClaimRecord {
  return { ...(r as ClaimRecord), odometerKm: r.odometerKm === null ? null : Number(r.odometerKm) };
}

/**
 * The tenant rule, in SQL: a dealer sees its own shop's claims; brand staff see claims
 * against their brand once submitted (drafts are the shop's own work).
 */
export function scopeClaims<T extends Knex.QueryBuilder>(q: T, user: Pick<AppUser, 'orgKind' | 'organisationId'>, alias = 'c'): T {
  if (user.orgKind === 'dealer') return q.where(`${alias}.dealer_id`, user.organisationId) as T;
  // Submitted ever, not merely "not a draft": a draft withdrawn before submission never reached the brand.
  return q.where(`${alias}.brand_id`, user.organisationId).whereNotNull(`${alias}.submitted_at`) as T;
}

export async function findClaimForUser(user: AppUser, id: string, q: Knex = db(), lock = false): Promise<ClaimRecord | null> {
  const query = scopeClaims(claimBase(q).select(claimColumns).where('c.id', id), user);
  if (lock) query.forUpdate('c');
  const r = await query.first();
  return r ? toClaim(r) : null;
}

/** Unscoped read for the server's own jobs (deadlines, carriers); never for a user's request. */
export async function findClaimById(id: string, q: Knex = db(), lock = false): Promise<ClaimRecord | null> {
  const query = claimBase(q).select(claimColumns).where('c.id', id);
  if (lock) query.forUpdate('c');
  const r = await query.first();
  return r ? toClaim(r) : null;
}

export type ClaimRowInput = {
  dealerId: string; brandId: string; dealerAccountId: string; modelId: string | null; registeredUnitId: string | null;
  frameSerial: string; partId: string | null; partCategory: string | null; partSerial: string; saleDate: string | null;
  failureDate: string | null; odometerKm: number | null; batteryCycles: number | null; symptom: string; errorCodes: string;
  description: string; customerName: string; customerEmail: string; customerPhone: string; requestedLines: RequestedLines;
};

function toRow(c: ClaimRowInput) {
  return {
    dealer_id: c.dealerId, brand_id: c.brandId, dealer_account_id: c.dealerAccountId, model_id: c.modelId,
    registered_unit_id: c.registeredUnitId, frame_serial: c.frameSerial, part_id: c.partId, part_category: c.partCategory,
    part_serial: c.partSerial, sale_date: c.saleDate, failure_date: c.failureDate, odometer_km: c.odometerKm,
    battery_cycles: c.batteryCycles, symptom: c.symptom, error_codes: c.errorCodes, description: c.description,
    customer_name: c.customerName, customer_email: c.customerEmail, customer_phone: c.customerPhone,
    requested_lines: JSON.stringify(c.requestedLines),
  };
}

export async function insertClaim(
  trx: Knex,
  c: ClaimRowInput & { number: string; stateValue: unknown; context: unknown; createdBy: string; clientKey?: string },
): Promise<string> {
  const [r] = await trx('claims')
    .insert({
      ...toRow(c), number: c.number, state_value: JSON.stringify(c.stateValue), context: JSON.stringify(c.context), created_by: c.createdBy,
      client_key: c.clientKey ?? null,
    })
    .returning('id');
  return r.id;
}

/** The draft a dealer's form already made under this key, if any. */
export async function findDraftByClientKey(dealerId: string, clientKey: string, q: Knex = db()): Promise<{ id: string; number: string } | null> {
  return (await q('claims').where({ dealer_id: dealerId, client_key: clientKey }).first('id', 'number')) ?? null;
}

/** Only a draft's details change in place; everything after submission goes through steps. */
export async function updateDraftClaim(trx: Knex, id: string, version: number, c: ClaimRowInput): Promise<boolean> {
  const n = await trx('claims')
    .where({ id, version, stage: 'draft' })
    .update({ ...toRow(c), version: trx.raw('version + 1'), updated_at: trx.fn.now() });
  return n === 1;
}

export async function writeStep(
  trx: Knex,
  claim: { id: string; version: number },
  next: { stateValue: unknown; context: unknown; extra?: Record<string, unknown> },
): Promise<boolean> {
  const n = await trx('claims')
    .where({ id: claim.id, version: claim.version })
    .update({
      state_value: JSON.stringify(next.stateValue),
      context: JSON.stringify(next.context),
      version: claim.version + 1,
      updated_at: trx.fn.now(),
      ...(next.extra ?? {}),
    });
  return n === 1;
}

export type ClaimEventRow = {
  id: number;
  actorId: string | null;
  actorName: string | null;
  actorRole: string;
  event: string;
  fromState: unknown;
  toState: unknown;
  payload: Record<string, unknown>;
  createdAt: Date;
};

export async function insertEvent(
  trx: Knex,
  e: { claimId: string; actorId: string | null; actorRole: string; event: string; fromState: unknown; toState: unknown; payload?: unknown },
): Promise<void> {
  await trx('claim_events').insert({
    claim_id: e.claimId, actor_id: e.actorId, actor_role: e.actorRole, event: e.event,
    from_state: e.fromState === undefined ? null : JSON.stringify(e.fromState),
    to_state: e.toState === undefined ? null : JSON.stringify(e.toState),
    payload: JSON.stringify(e.payload ?? {}),
  });
}

export async function listEvents(claimId: string): Promise<ClaimEventRow[]> {
  return db()('claim_events as e')
    .leftJoin('users as u', 'u.id', 'e.actor_id')
    .select('e.id', 'e.actor_id as actorId', 'u.name as actorName', 'e.actor_role as actorRole', 'e.event', 'e.from_state as fromState', 'e.to_state as toState', 'e.payload', 'e.created_at as createdAt')
    .where('e.claim_id', claimId)
    .orderBy('e.id');
}

export { nextBrandSequence, nextClaimSequence } from '@/db/sequences';

export type OpenClaimOnSerial = { id: string; number: string; stage: string; dealerId: string };

/** Claims still open on the same frame or part serial with this brand. */
export async function openClaimsOnSerial(
  brandId: string,
  serials: { frameSerial?: string; partSerial?: string },
  viewer: { dealerId: string | null },
  excludeId?: string,
): Promise<OpenClaimOnSerial[]> {
  if (!serials.frameSerial && !serials.partSerial) return [];
  const q = db()('claims')
    .select('id', 'number', 'stage', 'dealer_id as dealerId')
    .where({ brand_id: brandId })
    .whereNotIn('stage', ['withdrawn', 'denied', 'credited', 'reconciled'])
    // Another shop's unsubmitted claim is its own unfinished work, not a claim anyone else should see.
    .where((w) => w.whereNotNull('submitted_at').orWhere('dealer_id', viewer.dealerId ?? '00000000-0000-0000-0000-000000000000'))
    .where((w) => {
      if (serials.frameSerial) w.orWhereRaw('lower(frame_serial) = lower(?)', [serials.frameSerial]);
      if (serials.partSerial) w.orWhereRaw(`part_serial <> '' AND lower(part_serial) = lower(?)`, [serials.partSerial]);
    })
    .orderBy('created_at')
    .limit(10);
  if (excludeId) q.whereNot({ id: excludeId });
  return q;
}
