import type { Knex } from 'knex';
import { nextBrandSequence, nextClaimSequence } from '../sequences';
import { formatClaimNumber, formatRmaNumber } from '../../lib/credits/document-numbers';
import { initialClaimSnapshot, stepClaim, type ClaimEvent, type StoredClaim } from '../../machines/claim';

// Builds an approved claim the way the lifecycle would have made it: draft → submitted → in review →
// approved with an RMA, every step through the pure machine and logged as an event. Used by the demo
// scenario and by tests until the rep's approval screen writes such claims itself.

export type ApprovedClaimSpec = {
  brand: string;
  dealer: string;
  /** The dealer user who files, and the rep who approves (e-mails). */
  filedBy: string;
  approvedBy: string;
  frameSerial: string;
  failedPart: string;
  partSerial: string;
  symptom: string;
  description: string;
  customerName?: string;
  /** Charge cycles read from a battery's management system. */
  batteryCycles?: number;
  /** Replacement parts, by part number. */
  lines: { part: string; quantity?: number; fromDealerStock?: boolean }[];
  labor?: string[];
  /** When the rep approved; the earlier steps are placed a few hours before. */
  approvedAt?: Date;
  failureDate?: string;
  /** Stop earlier in the lifecycle (for tests of steps refused before approval). */
  upTo?: 'submitted' | 'in_review' | 'approved';
};

// knex rows are untyped here.
type Row = Record<string, any>;
const one = async (p: Promise<Row | undefined>, what: string): Promise<Row> => {
  const v = await p;
  if (!v) throw new Error(`approved claim builder: ${what} not found`);
  return v;
};

/** Inserts the claim and its log; returns its id, number and RMA. */
export async function insertApprovedClaim(
  knex: Knex,
  spec: ApprovedClaimSpec,
  /** Adds the dealer's files between the opening and the submission, so the log stays in order. */
  fileEvidence?: (claimId: string, at: string) => Promise<void>,
): Promise<{ id: string; number: string; rmaNumber: string | null }> {
  const brand = await one(knex('organisations').where({ slug: spec.brand }).first('id', 'name'), `brand ${spec.brand}`);
  const dealer = await one(knex('organisations').where({ slug: spec.dealer }).first('id'), `dealer ${spec.dealer}`);
  const account = await one(knex('dealer_accounts').where({ dealer_id: dealer.id, brand_id: brand.id }).first('id'), 'dealer account');
  const filer = await one(knex('users').whereRaw('lower(email) = lower(?)', [spec.filedBy]).first('id', 'role'), spec.filedBy);
  const rep = await one(knex('users').whereRaw('lower(email) = lower(?)', [spec.approvedBy]).first('id', 'role'), spec.approvedBy);
  const partOf = (pn: string) => one(knex('parts').where({ brand_id: brand.id, part_number: pn }).first('id', 'part_number', 'name', 'category'), `part ${pn}`);
  const failed = await partOf(spec.failedPart);
  const unit = await knex('registered_units').where({ brand_id: brand.id, frame_serial: spec.frameSerial }).first('id', 'model_id', 'retail_sale_date');

  const parts = [];
  for (const [i, l] of spec.lines.entries()) {
    const p = await partOf(l.part);
    parts.push({ lineId: `p${i + 1}`, partId: p.id, partNumber: p.part_number, name: p.name, quantity: l.quantity ?? 1, fromDealerStock: l.fromDealerStock ?? false });
  }
  const labor = [];
  for (const [i, code] of (spec.labor ?? []).entries()) {
    const op = await one(knex('labor_operations').where({ brand_id: brand.id, code }).first('id', 'code', 'description', 'standard_hours'), `labor ${code}`);
    labor.push({ lineId: `l${i + 1}`, operationId: op.id, code: op.code, description: op.description, hours: String(op.standard_hours) });
  }
  const lines = { parts, labor, freightMinor: 0 };

  const approvedAt = spec.approvedAt ?? new Date();
  const at = (hoursBefore: number) => new Date(approvedAt.getTime() - hoursBefore * 3_600_000).toISOString();
  const year = approvedAt.getUTCFullYear();
  const number = formatClaimNumber({ year, sequence: await nextClaimSequence(knex, year) });
  const upTo = spec.upTo ?? 'approved';
  const rmaNumber = upTo === 'approved' ? formatRmaNumber({ year, sequence: await nextBrandSequence(knex, brand.id, 'rma', year) }) : null;

  const dealerActor = { id: filer.id, role: filer.role };
  const repActor = { id: rep.id, role: rep.role };
  let stored: StoredClaim = initialClaimSnapshot({ openedBy: dealerActor, openedAt: at(30) });
  const log: { actor: string; role: string; event: string; from: unknown; to: unknown; payload: Record<string, unknown>; at: string }[] = [
    { actor: filer.id, role: filer.role, event: 'OPENED', from: null, to: stored.value, payload: { number }, at: at(30) },
  ];
  const allSteps: ClaimEvent[] = [
    { type: 'SUBMIT', actor: dealerActor, at: at(26), evidence: { photos: 3, serialLabelPhotos: 1, beforeTests: 1, proofOfPurchase: !unit, registered: !!unit } },
    { type: 'TAKE', actor: repActor, at: at(4) },
    {
      type: 'APPROVE', actor: repActor, at: at(0), extent: 'full', rmaNumber: rmaNumber ?? '', nothingToShip: parts.every((p) => p.fromDealerStock),
      lines: [...parts.map((p) => ({ lineId: p.lineId, approved: true })), ...labor.map((l) => ({ lineId: l.lineId, approved: true }))],
    },
  ];
  const steps = allSteps.slice(0, { submitted: 1, in_review: 2, approved: 3 }[upTo]);
  for (const step of steps) {
    const r = stepClaim(stored, step);
    if (!r.ok) throw new Error(`approved claim builder: ${step.type} refused: ${r.refusal}`);
    const { actor: _a, at: _t, type: _y, ...payload } = step as ClaimEvent & Record<string, unknown>;
    log.push({ actor: step.actor.id, role: step.actor.role, event: step.type, from: r.from, to: r.to, payload, at: step.at });
    stored = r.stored;
  }

  const [row] = await knex('claims')
    .insert({
      number, dealer_id: dealer.id, brand_id: brand.id, dealer_account_id: account.id, model_id: unit?.model_id ?? null,
      registered_unit_id: unit?.id ?? null, frame_serial: spec.frameSerial, part_id: failed.id, part_category: failed.category,
      part_serial: spec.partSerial, sale_date: unit?.retail_sale_date ?? null, failure_date: spec.failureDate ?? at(72).slice(0, 10),
      symptom: spec.symptom, description: spec.description, customer_name: spec.customerName ?? '', battery_cycles: spec.batteryCycles ?? null,
      requested_lines: JSON.stringify(lines), approved_lines: upTo === 'approved' ? JSON.stringify(lines) : null, state_value: JSON.stringify(stored.value),
      context: JSON.stringify(stored.context), version: steps.length, rma_number: rmaNumber, created_by: filer.id,
      created_at: at(30), updated_at: at(0), submitted_at: at(26),
    })
    .returning('id');
  for (const [i, e] of log.entries()) {
    if (i === 1 && fileEvidence) await fileEvidence(row.id, at(27));
    await knex('claim_events').insert({
      claim_id: row.id, actor_id: e.actor, actor_role: e.role, event: e.event, from_state: e.from === null ? null : JSON.stringify(e.from),
      to_state: JSON.stringify(e.to), payload: JSON.stringify(e.payload), created_at: e.at,
    });
  }
  return { id: row.id, number, rmaNumber };
}
