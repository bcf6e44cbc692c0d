import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { POST as stepsPOST } from '@/app/api/claims/[id]/steps/route';
import { GET as labelGET } from '@/app/api/shipments/[id]/label/route';
import { GET as rmaGET } from '@/app/api/warehouse/rma/[number]/route';
import { db } from '@/db/connection';
import { CarrierRefusal, carrierClient } from '@/lib/carrier';
import { actAs } from '../../support/acting-user';
import { approvedClaim, attachRecord, setStock } from '../../support/approved-claims';
import { ensureCarrier, stopCarrier } from '../../support/carrier';
import { call } from '../../support/route';

beforeAll(ensureCarrier);
afterAll(stopCarrier);

const WAREHOUSE = 'felix.moreau@torvane.test';
const DEALER = 'lena.hartmann@kettenblatt.test';
const REP = 'priya.nair@torvane.test';
const step = (id: string, body: Record<string, unknown>) => call(stepsPOST, { id }, { body });
const claimRow = (id: string) => db()('claims').where({ id }).first('stage', 'replacement_step', 'core_step', 'version', 'context');
const returnParcel = (id: string) => db()('shipments').where({ claim_id: id, direction: 'return' }).whereNull('voided_at').first();
const lastMailTo = (claimId: string, email: string) => db()('outbox').where({ claim_id: claimId, to_email: email }).orderBy('id', 'desc').first();

describe('core return of a drive unit (no dangerous goods)', () => {
  let claim: Awaited<ReturnType<typeof approvedClaim>>;

  beforeAll(async () => {
    claim = await approvedClaim({ failedPart: 'TV-DU60' });
  });

  it('the warehouse issues a prepaid return label; the dealer gets the instructions and can print it', async () => {
    await actAs(WAREHOUSE);
    const res = await step(claim.id, { type: 'ISSUE_RETURN_LABEL', version: 3, carrier: 'skeinway', service: 'ground' });
    expect(res.status, JSON.stringify(res.data)).toBe(200);
    const parcel = await returnParcel(claim.id);
    expect(parcel).toMatchObject({ carrier: 'skeinway', tracking_status: 'label_created', handed_over_at: null, dangerous_goods: null });
    const ctx = (await claimRow(claim.id)).context;
    expect(ctx.core).toMatchObject({ labelRef: parcel.tracking_number, dangerousGoods: false });
    const mail = await lastMailTo(claim.id, DEALER);
    expect(mail.subject).toMatch(/Return label ready/);
    expect(mail.text_body).toContain(`RMA ${claim.rmaNumber}`);

    await actAs(DEALER);
    const label = await call(labelGET, { id: parcel.id });
    expect(label.status).toBe(200);
    expect((label.data as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
  });

  it('the dealer marks the core shipped; a number in the wrong format is refused first', async () => {
    const parcel = await returnParcel(claim.id);
    await actAs(DEALER);
    const bad = await step(claim.id, { type: 'CORE_SHIPPED', version: 4, carrier: 'skeinway', trackingNumber: 'SK-12-34' });
    expect(bad.status).toBe(422);
    expect(bad.data.error).toMatch(/not a Skeinway Express tracking number/);
    await actAs(WAREHOUSE);
    expect((await step(claim.id, { type: 'CORE_SHIPPED', version: 4, carrier: 'skeinway', trackingNumber: parcel.tracking_number })).status).toBe(403);
    await actAs(DEALER);
    const ok = await step(claim.id, { type: 'CORE_SHIPPED', version: 4, carrier: 'skeinway', trackingNumber: parcel.tracking_number.toLowerCase() });
    expect(ok.status, JSON.stringify(ok.data)).toBe(200);
    expect((await claimRow(claim.id)).core_step).toBe('in_transit');
    expect((await returnParcel(claim.id)).handed_over_at).not.toBeNull();
    expect((await lastMailTo(claim.id, WAREHOUSE)).subject).toMatch(/on its way/);
  });

  it('finds the claim by RMA as a scanner types it; another brand, a mistyped or a claim number are refused', async () => {
    await actAs(WAREHOUSE);
    const compact = claim.rmaNumber!.replace(/-/g, '').toLowerCase();
    const found = await call(rmaGET, { number: compact });
    expect(found.status).toBe(200);
    expect(found.data).toMatchObject({ claimId: claim.id, rmaNumber: claim.rmaNumber });

    const wrongCheck = claim.rmaNumber!.slice(0, -1) + String((Number(claim.rmaNumber!.slice(-1)) + 1) % 10);
    const typo = await call(rmaGET, { number: wrongCheck });
    expect(typo.status).toBe(422);
    expect(typo.data.error).toMatch(/check digit does not match/);
    const claimNumber = await call(rmaGET, { number: claim.number });
    expect(claimNumber.status).toBe(422);
    expect(claimNumber.data.error).toMatch(/is a claim number; scan the RMA number/);

    await actAs('tom.reyes@wrenfield.test');
    expect((await call(rmaGET, { number: claim.rmaNumber! })).status).toBe(404);
    await actAs(DEALER);
    expect((await call(rmaGET, { number: claim.rmaNumber! })).status).toBe(403);
  });

  it('inspecting before receiving is refused (409); receiving records the condition', async () => {
    await actAs(WAREHOUSE);
    const early = await step(claim.id, { type: 'INSPECT', version: 5, result: 'fault_confirmed' });
    expect(early.status).toBe(409);
    expect(early.data.state).toEqual({ approved: { replacement: 'to_ship', core: 'in_transit' } });
    const res = await step(claim.id, { type: 'CORE_RECEIVED', version: 5, condition: 'sound', notes: 'Box intact, seal unbroken' });
    expect(res.status, JSON.stringify(res.data)).toBe(200);
    const row = await claimRow(claim.id);
    expect(row.core_step).toBe('received');
    expect(row.context.core).toMatchObject({ condition: 'sound', conditionNotes: 'Box intact, seal unbroken' });
    expect((await returnParcel(claim.id)).delivered_at).not.toBeNull();
  });

  it('the inspection needs a photo, and notes when the fault is not confirmed; no fault found leads to a chargeback', async () => {
    await actAs(WAREHOUSE);
    const noPhoto = await step(claim.id, { type: 'INSPECT', version: 6, result: 'no_fault_found', notes: 'Runs to spec on the bench dyno' });
    expect(noPhoto.status).toBe(422);
    expect(noPhoto.data.error).toMatch(/inspection photo/);
    const photo = await attachRecord(claim.id, 'inspection_photo', WAREHOUSE);
    const noNotes = await step(claim.id, { type: 'INSPECT', version: 6, result: 'no_fault_found' });
    expect(noNotes.status).toBe(409);
    expect(noNotes.data.error).toMatch(/notes are required when the fault is not confirmed/);
    const ok = await step(claim.id, { type: 'INSPECT', version: 6, result: 'no_fault_found', notes: 'Runs to spec on the bench dyno' });
    expect(ok.status, JSON.stringify(ok.data)).toBe(200);
    const row = await claimRow(claim.id);
    expect(row.core_step).toBe('inspected');
    expect(row.context.chargebackReasons).toEqual(['no_fault_found']);
    const event = await db()('claim_events').where({ claim_id: claim.id, event: 'INSPECT' }).first();
    expect(event.payload).toMatchObject({ result: 'no_fault_found', photoAttachmentIds: [photo] });
    expect((await lastMailTo(claim.id, 'hana.sato@torvane.test')).subject).toMatch(/inspected: no fault found/);
  });
});

describe('a damaged battery core (49 CFR 173.185(f); IATA SP A154)', () => {
  let claim: Awaited<ReturnType<typeof approvedClaim>>;
  const label = (extra: Record<string, unknown>) => ({ type: 'ISSUE_RETURN_LABEL', version: 3, carrier: 'skeinway', service: 'ground', ...extra });

  beforeAll(async () => {
    claim = await approvedClaim({ failedPart: 'TV-BP625', dealer: 'tidewheel', filedBy: 'theo.marsh@tidewheel.test' });
  });

  it('a label for a battery needs its condition; a damaged one needs the packaging confirmed and may not fly', async () => {
    await actAs(WAREHOUSE);
    const noCondition = await step(claim.id, label({}));
    expect(noCondition.status).toBe(422);
    expect(noCondition.data.error).toMatch(/sound or damaged/);
    const unconfirmed = await step(claim.id, label({ batteryCondition: 'damaged_or_defective' }));
    expect(unconfirmed.status).toBe(422);
    expect(unconfirmed.data.error).toMatch(/special packaging confirmed before a label is issued \(49 CFR 173\.185\(f\)\)/);
    const byAir = await step(claim.id, label({ batteryCondition: 'damaged_or_defective', packagingConfirmed: true, service: 'air_freighter' }));
    expect(byAir.status).toBe(422);
    expect(byAir.data.error).toMatch(/may not travel by air \(IATA special provision A154\); ground only/);
    expect(await returnParcel(claim.id)).toBeUndefined();
    expect((await claimRow(claim.id)).version).toBe(3);
  });

  it('the carrier itself refuses a damaged battery without the confirmation (same client a real carrier would get)', async () => {
    const dg = { unNumber: 'UN3480', properShippingName: 'Lithium ion batteries', watthours: 626.4, fullyRegulated: true, damaged: true, specialPackagingConfirmed: false };
    const addr = { name: 'A', line: 'B 1', city: 'C', postcode: '1', country: 'NL' };
    await expect(
      carrierClient().createShipment({ carrier: 'skeinway', service: 'ground', reference: 'test', shipFrom: addr, shipTo: addr, parcels: [{ weightKg: 3, description: 'core' }], dangerousGoods: [dg], handover: 'drop_off', idempotencyKey: `t-${Date.now()}` }),
    ).rejects.toThrow(CarrierRefusal);
  });

  it('with the confirmation, by ground: the label carries the damaged-battery marks; the database keeps it off aircraft', async () => {
    await actAs(WAREHOUSE);
    const ok = await step(claim.id, label({ batteryCondition: 'damaged_or_defective', packagingConfirmed: true }));
    expect(ok.status, JSON.stringify(ok.data)).toBe(200);
    const parcel = await returnParcel(claim.id);
    expect(parcel).toMatchObject({ battery_condition: 'damaged_or_defective', transport: 'ground' });
    expect(parcel.packaging_confirmed_at).not.toBeNull();
    // 36 V × 17.4 Ah = 626.4 Wh (49 CFR 171.8), damaged: special packaging, no small-battery provisions.
    expect(parcel.dangerous_goods[0]).toMatchObject({ unNumber: 'UN3480', watthours: 626.4, specialPackagingRequired: true });
    expect(parcel.dangerous_goods[0].marks).toContain('"DAMAGED/DEFECTIVE LITHIUM ION BATTERIES"');
    expect((await claimRow(claim.id)).context.core.dangerousGoods).toBe(true);
    await expect(db()('shipments').where({ id: parcel.id }).update({ transport: 'air_cargo_aircraft' })).rejects.toThrow(/shipments_damaged_battery/);
    const mail = await lastMailTo(claim.id, 'theo.marsh@tidewheel.test');
    expect(mail.text_body).toMatch(/damaged or defective lithium battery \(UN3480, 626\.4 Wh\).*ground transport only/);
  });

  it('the dealer must ship it on that label and confirm the packing', async () => {
    const parcel = await returnParcel(claim.id);
    await actAs('theo.marsh@tidewheel.test');
    const otherLabel = await step(claim.id, { type: 'CORE_SHIPPED', version: 4, carrier: 'ferrule', trackingNumber: 'FP4821397608', packedAsInstructed: true });
    expect(otherLabel.status).toBe(422);
    expect(otherLabel.data.error).toMatch(/Ship the battery on the brand’s return label/);
    const unconfirmed = await step(claim.id, { type: 'CORE_SHIPPED', version: 4, carrier: 'skeinway', trackingNumber: parcel.tracking_number });
    expect(unconfirmed.status).toBe(422);
    expect(unconfirmed.data.error).toMatch(/Confirm the damaged battery is packed/);
    const ok = await step(claim.id, { type: 'CORE_SHIPPED', version: 4, carrier: 'skeinway', trackingNumber: parcel.tracking_number, packedAsInstructed: true });
    expect(ok.status, JSON.stringify(ok.data)).toBe(200);
    expect((await lastMailTo(claim.id, WAREHOUSE)).body ?? (await lastMailTo(claim.id, WAREHOUSE)).text_body).toMatch(/declared damaged or defective/);
  });
});

describe('a battery core without a label, and a waived return', () => {
  it('a battery core never travels on the dealer’s own label', async () => {
    const claim = await approvedClaim({ failedPart: 'TV-BP500' });
    await actAs(DEALER);
    const res = await step(claim.id, { type: 'CORE_SHIPPED', version: 3, carrier: 'ferrule', trackingNumber: 'FP4821397608', packedAsInstructed: true });
    expect(res.status).toBe(422);
    expect(res.data.error).toMatch(/travels only on the return label the brand issues/);
  });

  it('the rep waives the return with a disposal photo; the label is cancelled; the wrong file or role is refused', async () => {
    const claim = await approvedClaim({ failedPart: 'TV-BP500' });
    await actAs(WAREHOUSE);
    expect((await step(claim.id, { type: 'ISSUE_RETURN_LABEL', version: 3, carrier: 'skeinway', service: 'ground', batteryCondition: 'sound' })).status).toBe(200);
    const parcel = await returnParcel(claim.id);
    const inspection = await attachRecord(claim.id, 'inspection_photo', WAREHOUSE);
    const proof = await attachRecord(claim.id, 'core_disposal_proof', DEALER);

    expect((await step(claim.id, { type: 'WAIVE_CORE', version: 4, reason: 'local_recycling', proofAttachmentId: proof })).status).toBe(403);
    await actAs(REP);
    const wrong = await step(claim.id, { type: 'WAIVE_CORE', version: 4, reason: 'local_recycling', proofAttachmentId: inspection });
    expect(wrong.status).toBe(422);
    expect(wrong.data.error).toMatch(/proof of local recycling or scrapping/);
    const ok = await step(claim.id, { type: 'WAIVE_CORE', version: 4, reason: 'local_recycling', proofAttachmentId: proof });
    expect(ok.status, JSON.stringify(ok.data)).toBe(200);
    const row = await claimRow(claim.id);
    expect(row.core_step).toBe('waived');
    expect(row.context.chargebackReasons).toEqual([]);
    expect(await db()('shipments').where({ id: parcel.id }).first('voided_at')).toMatchObject({ voided_at: expect.any(Date) });
    await actAs(DEALER);
    expect((await call(labelGET, { id: parcel.id })).status).toBe(404);
  });
});

describe('stock for a back-order is visible before it ships', () => {
  it('keeps the claim waiting while the part is short', async () => {
    await setStock('torvane', 'TV-DU85', 0, '2027-02-01');
    const claim = await approvedClaim({ failedPart: 'TV-DU85' });
    await actAs(WAREHOUSE);
    const res = await step(claim.id, { type: 'SHIP', version: 3, carrier: 'ferrule', service: 'road', tracking: 'book', pickedLineIds: ['p1'] });
    expect(res.status).toBe(409);
    expect(res.data.error).toMatch(/more expected 2027-02-01/);
  });
});
