import { createHash } from 'node:crypto';
import { nextBrandSequence, nextClaimSequence } from '../sequences';
import type { Knex } from 'knex';
import { daysBetween } from '@/lib/calendar';
import { localDate } from '@/lib/calendar/time-zone';
import { computeCredit, formatClaimNumber, formatCreditMemoNumber, formatRmaNumber } from '@/lib/credits';
import { draftHash } from '@/lib/credits/draft-hash';
import { creditInputFromClaim, type ClaimLines } from '@/lib/credits/from-claim';
import { memoLineRow } from '@/lib/db/memo-rows';
import { toDecimalString } from '@/lib/money';
import { DEMO_CARRIER, demoTrackingNumber, insertDemoParcel } from './demo-shipments';
import { initialClaimSnapshot, stepClaim, type Actor, type ClaimContext, type ClaimEvent, type StoredClaim } from '@/machines/claim';

// Drives a claim through its lifecycle with the pure machine, writing state and event rows as
// the server's step function does, with back-dated times. For the demo scenario and for tests
// that need a claim in a given state before the review and fulfilment screens exist.
// Every step is checked by the machine; a refused step throws.

export type NewClaim = {
  dealerId: string;
  brandId: string;
  frameSerial: string;
  partNumber: string;
  partSerial: string;
  failureDate: string;
  symptom: string;
  description: string;
  customerName: string;
  /** Charge cycles read from a battery's management system. */
  batteryCycles?: number;
  /** Part numbers with quantities; labor operation codes; freight in minor units. */
  parts: { partNumber: string; quantity: number; fromDealerStock: boolean }[];
  labor: string[];
  freightMinor: number;
  openedBy: string;
  openedAt: string;
};

/** Inserts a draft claim with its request lines resolved against the brand's catalog. */
export async function insertDraftClaim(knex: Knex, c: NewClaim): Promise<{ id: string; number: string }> {
  const account = await knex('dealer_accounts').where({ dealer_id: c.dealerId, brand_id: c.brandId }).first('id');
  if (!account) throw new Error(`no dealer account for ${c.dealerId} with ${c.brandId}`);
  const part = await knex('parts').where({ brand_id: c.brandId, part_number: c.partNumber }).first('id', 'category');
  if (!part) throw new Error(`no part ${c.partNumber}`);
  const unit = await knex('registered_units').where({ brand_id: c.brandId, frame_serial: c.frameSerial }).first('id', 'model_id', 'retail_sale_date');
  const parts: (ClaimLines['parts'][number] & { partId: string })[] = [];
  for (const [i, p] of c.parts.entries()) {
    const row = await knex('parts').where({ brand_id: c.brandId, part_number: p.partNumber }).first('id', 'name');
    if (!row) throw new Error(`no part ${p.partNumber}`);
    parts.push({ lineId: `p${i + 1}`, partId: row.id, partNumber: p.partNumber, name: row.name, quantity: p.quantity, fromDealerStock: p.fromDealerStock });
  }
  const labor = [];
  for (const [i, code] of c.labor.entries()) {
    const op = await knex('labor_operations').where({ brand_id: c.brandId, code }).first('id', 'description', 'standard_hours');
    if (!op) throw new Error(`no labor operation ${code}`);
    labor.push({ lineId: `l${i + 1}`, operationId: op.id, code, description: op.description, hours: String(op.standard_hours) });
  }
  const year = Number(c.openedAt.slice(0, 4));
  const number = formatClaimNumber({ year, sequence: await nextClaimSequence(knex, year) });
  const initial = initialClaimSnapshot({ openedBy: { id: c.openedBy, role: 'dealer' }, openedAt: c.openedAt });
  const [row] = await knex('claims')
    .insert({
      number, dealer_id: c.dealerId, brand_id: c.brandId, dealer_account_id: account.id, model_id: unit?.model_id ?? null,
      registered_unit_id: unit?.id ?? null, frame_serial: c.frameSerial, part_id: part.id, part_category: part.category,
      part_serial: c.partSerial, sale_date: unit?.retail_sale_date ?? null, failure_date: c.failureDate, symptom: c.symptom,
      description: c.description, customer_name: c.customerName, battery_cycles: c.batteryCycles ?? null,
      requested_lines: JSON.stringify({ parts, labor, freightMinor: c.freightMinor }),
      state_value: JSON.stringify(initial.value), context: JSON.stringify(initial.context), created_by: c.openedBy,
      created_at: c.openedAt, updated_at: c.openedAt,
    })
    .returning('id');
  await knex('claim_events').insert({
    claim_id: row.id, actor_id: c.openedBy, actor_role: 'dealer', event: 'OPENED', from_state: null,
    to_state: JSON.stringify(initial.value), payload: JSON.stringify({ number }), created_at: c.openedAt,
  });
  return { id: row.id, number };
}

export type Step = { type: ClaimEvent['type']; actor: Actor; at: string } & Record<string, unknown>;

/** One step through the machine, stored with its back-dated time. */
export async function driveStep(knex: Knex, claimId: string, step: Step, columns: Record<string, unknown> = {}): Promise<StoredClaim> {
  const row = await knex('claims').where({ id: claimId }).forUpdate().first('state_value', 'context', 'version');
  const stored: StoredClaim = { value: row.state_value, context: row.context };
  const result = stepClaim(stored, step as unknown as ClaimEvent);
  if (!result.ok) throw new Error(`${step.type} refused: ${result.refusal}`);
  const n = await knex('claims')
    .where({ id: claimId, version: row.version })
    .update({
      state_value: JSON.stringify(result.stored.value), context: JSON.stringify(result.stored.context),
      version: row.version + 1, updated_at: step.at, ...columns,
    });
  if (n !== 1) throw new Error('claim changed while being driven');
  const { type, actor, at, ...payload } = step;
  await knex('claim_events').insert({
    claim_id: claimId, actor_id: actor.role === 'system' ? null : actor.id, actor_role: actor.role, event: type,
    from_state: JSON.stringify(result.from), to_state: JSON.stringify(result.to), payload: JSON.stringify(payload), created_at: at,
  });
  return result.stored;
}

export type CoreEnd = 'fault_confirmed' | 'no_fault_found' | 'not_covered' | 'waived' | 'written_off';

export type Path = {
  dealer: string;
  rep: string;
  warehouse: string;
  /** The first step's time; later steps follow a few days apart. */
  submittedAt: string;
  /** Approved lines as the review records them; default: everything as requested. */
  approved?: (requested: ClaimLines) => ClaimLines;
  afterTest: 'passed' | 'accepted_by_hand' | 'failed';
  core: CoreEnd;
  /** Stop early, e.g. with the replacement still to ship. */
  stopAfter?: 'approved' | 'fitted';
  /** Why the rep accepted the repair by hand, when the after-test could not verify it. */
  acceptReason?: string;
  /**
   * The stored files the after-test and waiver steps name. Without them (tests that only need the
   * money end) the steps carry made-up ids, which nothing on those tests' screens reads.
   */
  evidence?: {
    afterTest(at: string): Promise<{ runId: string; meets: boolean }>;
    disposalProof(at: string): Promise<string>;
  };
};

const later = (iso: string, days: number, hours = 0) => new Date(Date.parse(iso) + days * 86_400_000 + hours * 3_600_000).toISOString();

/**
 * Submit → take → approve (RMA number, approved lines) → ship (unless every part came from the
 * dealer's stock) → fitted with the after-test →
 * the core's end (inspected, waived or written off) → credit pending.
 */
export async function driveToCreditPending(knex: Knex, claimId: string, p: Path): Promise<{ rmaNumber: string; at: string }> {
  const claim = await knex('claims').where({ id: claimId }).first('brand_id', 'requested_lines');
  const dealer = { id: p.dealer, role: 'dealer' as const };
  const rep = { id: p.rep, role: 'brand_rep' as const };
  const wh = { id: p.warehouse, role: 'warehouse' as const };
  const system = { id: 'system', role: 'system' as const };
  let t = p.submittedAt;
  const next = (days: number, hours = 0) => (t = later(t, days, hours));

  await driveStep(knex, claimId, {
    type: 'SUBMIT', actor: dealer, at: t,
    evidence: { photos: 2, serialLabelPhotos: 1, beforeTests: 1, proofOfPurchase: false, registered: true },
  }, { submitted_at: t });
  await driveStep(knex, claimId, { type: 'TAKE', actor: rep, at: next(0, 3) });
  const requested = claim.requested_lines as ClaimLines;
  const approved = p.approved ? p.approved(requested) : requested;
  const year = Number(t.slice(0, 4));
  const rmaNumber = formatRmaNumber({ year, sequence: await nextBrandSequence(knex, claim.brand_id, 'rma', year) });
  const lines = [
    ...requested.parts.map((l) => ({ lineId: l.lineId, approved: approved.parts.some((a) => a.lineId === l.lineId && a.quantity > 0) })),
    ...requested.labor.map((l) => ({ lineId: l.lineId, approved: approved.labor.some((a) => a.lineId === l.lineId && a.hours !== '0') })),
  ];
  const extent = lines.every((l) => l.approved) ? 'full' : 'partial';
  const nothingToShip = !approved.parts.some((l) => l.quantity > 0 && !l.fromDealerStock);
  await driveStep(knex, claimId, { type: 'APPROVE', actor: rep, at: next(1), extent, lines, rmaNumber, nothingToShip }, {
    rma_number: rmaNumber, approved_lines: JSON.stringify(approved),
  });
  if (p.stopAfter === 'approved') return { rmaNumber, at: t };
  if (!nothingToShip) {
    await driveStep(knex, claimId, { type: 'SHIP', actor: wh, at: next(1), carrier: DEMO_CARRIER, trackingNumber: demoTrackingNumber(claimId, 'outbound'), service: 'road' });
    await insertDemoParcel(knex, claimId, { direction: 'outbound', handedOverAt: t, deliveredAt: later(t, 2), createdBy: p.warehouse });
  }
  const fittedAt = next(3);
  const run = p.evidence ? await p.evidence.afterTest(later(fittedAt, 0, -1)) : { runId: `after-${claimId.slice(0, 8)}`, meets: p.afterTest === 'passed' };
  if (run.meets !== (p.afterTest === 'passed')) throw new Error(`claim ${claimId}: the after-test ${run.meets ? 'meets' : 'misses'} the spec, but the path says ${p.afterTest}`);
  await driveStep(knex, claimId, { type: 'MARK_FITTED', actor: dealer, at: fittedAt, afterTestId: run.runId, afterTestPasses: run.meets });
  if (p.afterTest === 'accepted_by_hand') {
    await driveStep(knex, claimId, {
      type: 'ACCEPT_BY_HAND', actor: rep, at: next(1),
      reason: p.acceptReason ?? 'Roller slipped on the after-run; the rider confirms full assist on a road test.',
    });
  }
  if (p.stopAfter === 'fitted') return { rmaNumber, at: t };
  if (p.core === 'waived') {
    const waivedAt = next(1);
    const proof = p.evidence ? await p.evidence.disposalProof(later(waivedAt, 0, -2)) : `recycling-note-${claimId.slice(0, 8)}`;
    await driveStep(knex, claimId, { type: 'WAIVE_CORE', actor: rep, at: waivedAt, reason: 'local_recycling', proofAttachmentId: proof });
  } else if (p.core === 'written_off') {
    await driveStep(knex, claimId, { type: 'REMIND_CORE', actor: system, at: next(10) });
    await driveStep(knex, claimId, { type: 'WRITE_OFF_CORE', actor: system, at: next(6) });
  } else {
    await driveStep(knex, claimId, { type: 'CORE_SHIPPED', actor: dealer, at: next(1), carrier: DEMO_CARRIER, trackingNumber: demoTrackingNumber(claimId, 'return'), onReturnLabel: false });
    await insertDemoParcel(knex, claimId, { direction: 'return', handedOverAt: t, deliveredAt: later(t, 2), createdBy: p.dealer });
    await driveStep(knex, claimId, { type: 'CORE_RECEIVED', actor: wh, at: next(3), condition: 'sound' });
    const notes: Record<string, string | undefined> = {
      fault_confirmed: undefined,
      no_fault_found: 'Bench run for 40 min at rated load: no fault, no stored error codes.',
      not_covered: 'Housing cracked at the mounting lug; impact damage, not a manufacturing fault.',
    };
    const note = notes[p.core];
    await driveStep(knex, claimId, { type: 'INSPECT', actor: wh, at: next(2), result: p.core, ...(note ? { notes: note } : {}) });
  }
  return { rmaNumber, at: t };
}

// ---- credits, for the demo scenario and tests: the same rules as the server's use cases ----

/** Computes the claim's credit with the credit rules and issues it (ISSUE_CREDIT) at a back-dated time. */
export async function issueCreditDirect(knex: Knex, claimId: string, accountantId: string, at: string): Promise<{ memoId: string; number: string; totalMinor: number }> {
  const c = await knex('claims as c')
    .join('dealer_accounts as a', 'a.id', 'c.dealer_account_id')
    .join('organisations as b', 'b.id', 'c.brand_id')
    .where('c.id', claimId)
    .first(
      'c.id', 'c.number', 'c.brand_id', 'c.dealer_id', 'c.dealer_account_id', 'c.rma_number', 'c.requested_lines', 'c.approved_lines', 'c.context',
      'a.account_number', 'a.labor_rate_minor', 'b.max_labor_rate_minor', 'b.time_zone', 'b.currency',
    );
  const lines = [c.requested_lines, ...(c.approved_lines ? [c.approved_lines] : [])] as ClaimLines[];
  const partNumbers = [...new Set(lines.flatMap((l) => l.parts.map((p) => p.partNumber)))];
  const codes = [...new Set(lines.flatMap((l) => l.labor.map((x) => x.code)))];
  const parts = await knex('parts').select('part_number', 'category').where({ brand_id: c.brand_id }).whereIn('part_number', partNumbers);
  const ops = await knex('labor_operations').select('code', 'standard_hours').where({ brand_id: c.brand_id }).whereIn('code', codes);
  const prices = await knex('price_list as pl').join('parts as p', 'p.id', 'pl.part_id')
    .select('p.part_number as partNumber', 'pl.net_price_minor as dealerNetMinor', 'pl.effective_from as effectiveFrom')
    .where('pl.brand_id', c.brand_id).whereIn('p.part_number', partNumbers);
  const ctx = c.context as ClaimContext;
  const input = creditInputFromClaim(
    {
      currency: c.currency, requested: c.requested_lines, approved: c.approved_lines, approvalFlags: ctx.approvedLines, afterTest: ctx.afterTest,
      chargebackReasons: ctx.chargebackReasons, inspectionNotes: ctx.core.inspection?.notes ?? null,
      priceDate: localDate(ctx.replacement.fittedAt ?? at, c.time_zone),
      laborRates: { dealerRateMinor: Number(c.labor_rate_minor), brandMaxRateMinor: Number(c.max_labor_rate_minor) },
    },
    {
      partCategories: Object.fromEntries(parts.map((p) => [p.part_number, p.category])),
      scheduledHours: Object.fromEntries(ops.map((o) => [o.code, String(o.standard_hours)])),
      priceList: prices.map((p) => ({ ...p, dealerNetMinor: Number(p.dealerNetMinor), effectiveFrom: String(p.effectiveFrom).slice(0, 10) })),
    },
  );
  const draft = computeCredit(input);
  const issuedOn = localDate(at, c.time_zone);
  const year = Number(issuedOn.slice(0, 4));
  const number = formatCreditMemoNumber({ year, sequence: await nextBrandSequence(knex, c.brand_id, 'credit_memo', year) });
  const hash = draftHash(draft);
  const [memo] = await knex('credit_memos')
    .insert({
      brand_id: c.brand_id, dealer_id: c.dealer_id, dealer_account_id: c.dealer_account_id, claim_id: c.id, number, kind: 'claim',
      dealer_account_number: c.account_number, claim_number: c.number, rma_number: c.rma_number, currency: c.currency,
      total_minor: draft.totalMinor, issued_on: issuedOn, issued_at: at, issued_by: accountantId,
      idempotency_key: `issue:${c.id}:0:${hash}`, draft_hash: hash,
    })
    .returning('id');
  await knex('credit_memo_lines').insert(draft.lines.map((l) => memoLineRow(memo.id, l)));
  await driveStep(knex, claimId, { type: 'ISSUE_CREDIT', actor: { id: accountantId, role: 'accountant' }, at, memoId: memo.id });
  return { memoId: memo.id, number, totalMinor: draft.totalMinor };
}

/**
 * A dealer statement line naming the memo, matched and confirmed, and the claim reconciled
 * (RECONCILE), at a back-dated time.
 */
export async function reconcileDirect(
  knex: Knex,
  memo: { memoId: string; number: string; totalMinor: number },
  s: { sourceName: string; fileName: string; accountantId: string; lineDate: string; at: string },
): Promise<void> {
  const m = await knex('credit_memos').where({ id: memo.memoId }).first('brand_id', 'dealer_id', 'currency', 'claim_id', 'issued_on');
  let source = await knex('statement_sources').where({ brand_id: m.brand_id }).whereRaw('lower(name) = lower(?)', [s.sourceName]).first('id');
  const mapping = { date: 'Date', reference: 'Reference', amount: 'Amount' };
  const options = { dateFormat: 'YYYY-MM-DD', decimalSeparator: '.', negate: false, dateWindowDays: 14 };
  if (!source) {
    [source] = await knex('statement_sources')
      .insert({ brand_id: m.brand_id, name: s.sourceName, dealer_id: m.dealer_id, mapping: JSON.stringify(mapping), options: JSON.stringify(options) })
      .returning('id');
  }
  const content = `Date,Reference,Amount\n${s.lineDate},${memo.number},${toDecimalString(memo.totalMinor, m.currency)}\n`;
  const [imp] = await knex('statement_imports')
    .insert({
      brand_id: m.brand_id, source_id: source.id, dealer_id: m.dealer_id, file_name: s.fileName, sha256: createHash('sha256').update(content).digest('hex'),
      currency: m.currency, date_window_days: 14, mapping: JSON.stringify(mapping), options: JSON.stringify(options), line_count: 1,
      imported_by: s.accountantId, imported_at: s.at,
    })
    .returning('id');
  const [line] = await knex('statement_lines')
    .insert({
      import_id: imp.id, line_no: 2, reference: memo.number, amount_minor: memo.totalMinor, line_date: s.lineDate, currency: m.currency,
      dealer_id: m.dealer_id, outcome: JSON.stringify({ type: 'proposed' }),
    })
    .returning('id');
  const [match] = await knex('reconciliation_matches')
    .insert({
      brand_id: m.brand_id, statement_line_id: line.id, memo_id: memo.memoId, basis: 'reference', reference_field: 'memo_number',
      amount_difference_minor: 0, days_apart: daysBetween(String(m.issued_on).slice(0, 10), s.lineDate), proposed_by: s.accountantId, created_at: s.at,
    })
    .returning('id');
  await knex('reconciliation_events').insert({ brand_id: m.brand_id, match_id: match.id, event: 'proposed', actor_id: s.accountantId, note: 'found by reference', created_at: s.at });
  await knex('reconciliation_matches').where({ id: match.id }).update({ status: 'confirmed', decided_by: s.accountantId, decided_at: s.at });
  await knex('reconciliation_events').insert({ brand_id: m.brand_id, match_id: match.id, event: 'confirmed', actor_id: s.accountantId, created_at: s.at });
  await driveStep(knex, m.claim_id, { type: 'RECONCILE', actor: { id: s.accountantId, role: 'accountant' }, at: s.at, statementLineRef: `${s.fileName}, row 2` });
}
