import { PDFParse } from 'pdf-parse';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GET as packingSlipGET } from '@/app/api/claims/[id]/packing-slip/route';
import { POST as stepsPOST } from '@/app/api/claims/[id]/steps/route';
import { GET as labelGET } from '@/app/api/shipments/[id]/label/route';
import { db } from '@/db/connection';
import { checkTrackingNumber, ferruleNumber } from '@/lib/carrier/carriers';
import { addBusinessDays, localDate } from '@/lib/calendar';
import { pollTracking } from '@/lib/services/tracking';
import { actAs } from '../../support/acting-user';
import { approvedClaim, onHand, setStock } from '../../support/approved-claims';
import { advanceParcel, carrierBookings, ensureCarrier, stopCarrier } from '../../support/carrier';
import { decodeCode128Image } from '../../support/code128-decode';
import { call } from '../../support/route';

beforeAll(ensureCarrier);
afterAll(stopCarrier);

const WAREHOUSE = 'felix.moreau@torvane.test';
const step = (id: string, body: Record<string, unknown>) => call(stepsPOST, { id }, { body });
const claimRow = (id: string) => db()('claims').where({ id }).first('stage', 'replacement_step', 'core_step', 'version', 'context');
const liveOutbound = (id: string) => db()('shipments').where({ claim_id: id, direction: 'outbound' }).whereNull('voided_at');
const bookingsFor = (rma: string | null) => carrierBookings(rma);
const ship = (version = 3, extra: Record<string, unknown> = {}) => ({ type: 'SHIP', version, carrier: 'ferrule', service: 'road', tracking: 'book', pickedLineIds: ['p1'], ...extra });

describe('the warehouse ships a replacement', () => {
  let claim: Awaited<ReturnType<typeof approvedClaim>>;
  let partId: string;
  let shipmentId: string;

  beforeAll(async () => {
    claim = await approvedClaim({ failedPart: 'TV-BP500' });
    partId = await setStock('torvane', 'TV-BP500', 3);
  });

  it('books the carrier, stores the label, takes one from stock in the same step, logs it and tells the dealer', async () => {
    await actAs(WAREHOUSE);
    const outboxBefore = Number((await db()('outbox').where({ claim_id: claim.id }).count('id as n').first())!.n);
    const res = await step(claim.id, ship());
    expect(res.status, JSON.stringify(res.data)).toBe(200);
    shipmentId = res.data.shipmentId;
    expect(res.data).toMatchObject({ stage: 'approved', to: { approved: { replacement: 'shipped', core: 'requested' } } });

    expect(await claimRow(claim.id)).toMatchObject({ replacement_step: 'shipped', version: 4 });
    expect(await onHand(partId)).toBe(2);
    const movement = await db()('stock_movements').where({ part_id: partId, claim_id: claim.id }).first();
    expect(movement).toMatchObject({ kind: 'shipment', delta: -1, on_hand_after: 2 });

    const parcel = await liveOutbound(claim.id).first();
    expect(checkTrackingNumber('ferrule', parcel.tracking_number)).toEqual({ ok: true, canonical: parcel.tracking_number });
    expect(parcel).toMatchObject({ carrier: 'ferrule', service: 'road', transport: 'ground', battery_condition: 'sound' });
    // Every battery shipment is classified: 36 V × 13.9 Ah = 500.4 Wh alone → UN3480, fully regulated (49 CFR 173.185(c)).
    expect(parcel.dangerous_goods[0]).toMatchObject({ partNumber: 'TV-BP500', unNumber: 'UN3480', watthours: 500.4, fullyRegulated: true });

    const event = await db()('claim_events').where({ claim_id: claim.id, event: 'SHIP' }).first();
    expect(event.payload).toMatchObject({ carrier: 'ferrule', trackingNumber: parcel.tracking_number, service: 'road', lines: ['1 × TV-BP500'] });
    const mail = await db()('outbox').where({ claim_id: claim.id }).orderBy('id');
    expect(mail.length).toBeGreaterThan(outboxBefore);
    expect(mail.map((m) => m.to_email)).toContain('lena.hartmann@kettenblatt.test');
    expect(mail.at(-1).subject).toMatch(/Replacement for WC-\d{4}-\d{6}-\d shipped/);
    expect(await bookingsFor(claim.rmaNumber)).toHaveLength(1);
  });

  it('prints a packing slip whose text and Code 128 barcode both read back as the RMA number', async () => {
    await actAs(WAREHOUSE);
    const res = await call(packingSlipGET, { id: claim.id });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/pdf');
    const pdf = res.data as Buffer;
    const parser = new PDFParse({ data: pdf });
    const text = (await parser.getText()).text;
    const parcel = await liveOutbound(claim.id).first();
    for (const expected of [claim.rmaNumber!, claim.number, 'Kettenblatt Radwerk', 'Mühlenweg 7', '79098 Freiburg im Breisgau', 'Torvane Drive Systems', 'TV-BP500', parcel.tracking_number, 'Ferrule Parcel', 'UN3480']) {
      expect(text).toContain(expected);
    }
    const images = await parser.getImage({ imageBuffer: true, imageDataUrl: false, imageThreshold: 0 });
    const barcode = images.pages[0]!.images[0]!;
    const raw = await sharp(Buffer.from(barcode.data)).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
    expect(decodeCode128Image(raw.data, raw.info.width, raw.info.height, raw.info.channels).text).toBe(claim.rmaNumber);
    await parser.destroy();
  });

  it('lets the dealer print the slip once shipped, never the outbound label; another shop sees nothing', async () => {
    await actAs('lena.hartmann@kettenblatt.test');
    expect((await call(packingSlipGET, { id: claim.id })).status).toBe(200);
    expect((await call(labelGET, { id: shipmentId })).status).toBe(403);
    await actAs('sam.okafor@lanternhill.test');
    expect((await call(packingSlipGET, { id: claim.id })).status).toBe(404);
    expect((await call(labelGET, { id: shipmentId })).status).toBe(404);
    await actAs(WAREHOUSE);
    const label = await call(labelGET, { id: shipmentId });
    expect(label.status).toBe(200);
    expect((label.data as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
  });

  it('refuses to ship twice: 409 with the current state, nothing booked, stock untouched', async () => {
    await actAs(WAREHOUSE);
    const before = (await bookingsFor(claim.rmaNumber)).length;
    const res = await step(claim.id, ship(4));
    expect(res.status).toBe(409);
    expect(res.data.error).toMatch(/cannot|not|already/i);
    expect(res.data.state).toEqual({ approved: { replacement: 'shipped', core: 'requested' } });
    expect(await onHand(partId)).toBe(2);
    expect(await liveOutbound(claim.id)).toHaveLength(1);
    expect(await bookingsFor(claim.rmaNumber)).toHaveLength(before);
  });

  it('polls the carrier: in transit, then delivered; the delivery starts the core clock in business days and tells the dealer', async () => {
    const parcel = await liveOutbound(claim.id).first();
    await advanceParcel(parcel.tracking_number, 'in_transit');
    await pollTracking();
    expect((await liveOutbound(claim.id).first()).tracking_status).toBe('in_transit');

    await advanceParcel(parcel.tracking_number, 'delivered');
    await pollTracking();
    const delivered = await liveOutbound(claim.id).first();
    expect(delivered.tracking_status).toBe('delivered');
    expect(delivered.delivered_at).not.toBeNull();
    const events = await db()('shipment_events').where({ shipment_id: delivered.id });
    expect(events.map((e) => e.status).sort()).toEqual(['delivered', 'in_transit', 'label_created', 'out_for_delivery', 'picked_up']);
    // Torvane: 15 business days for a battery core, Europe/Amsterdam, with its holidays.
    const holidays = (await db()('brand_holidays').join('organisations as o', 'o.id', 'brand_holidays.brand_id').where('o.slug', 'torvane').select('day')).map((r) => r.day);
    const start = localDate(new Date(delivered.delivered_at).toISOString(), 'Europe/Amsterdam');
    expect(delivered.core_due_on).toBe(addBusinessDays(start, 15, { holidays }));
    const note = await db()('claim_events').where({ claim_id: claim.id, event: 'REPLACEMENT_DELIVERED' });
    expect(note).toHaveLength(1);
    expect((await db()('outbox').where({ claim_id: claim.id }).orderBy('id', 'desc').first()).subject).toMatch(/delivered/);

    // Polling again adds nothing: the parcel is delivered and its events are already there.
    await pollTracking();
    expect(await db()('shipment_events').where({ shipment_id: delivered.id })).toHaveLength(5);
    expect(await db()('claim_events').where({ claim_id: claim.id, event: 'REPLACEMENT_DELIVERED' })).toHaveLength(1);
  });
});

describe('refusals before anything is booked', () => {
  it('a claim that is not approved cannot ship (409), and no carrier is asked', async () => {
    const claim = await approvedClaim({ failedPart: 'TV-DU60', upTo: 'in_review' });
    await actAs(WAREHOUSE);
    const before = (await carrierBookings()).length;
    const res = await step(claim.id, ship(2));
    expect(res.status).toBe(409);
    expect(res.data.error).toMatch(/no replacement to ship before the claim is approved|replacement/i);
    expect(res.data.stage).toBe('in_review');
    expect(await carrierBookings()).toHaveLength(before);
    expect((await claimRow(claim.id)).stage).toBe('in_review');
  });

  it('wrong role is 403, another brand is 404; nothing changes', async () => {
    const claim = await approvedClaim({ failedPart: 'TV-DU60' });
    await setStock('torvane', 'TV-DU60', 5);
    await actAs('lena.hartmann@kettenblatt.test');
    expect((await step(claim.id, ship())).status).toBe(403);
    await actAs('priya.nair@torvane.test');
    expect((await step(claim.id, ship())).status).toBe(403);
    await actAs('tom.reyes@wrenfield.test');
    expect((await step(claim.id, ship())).status).toBe(404);
    expect(await claimRow(claim.id)).toMatchObject({ replacement_step: 'to_ship', version: 3 });
    expect(await bookingsFor(claim.rmaNumber)).toHaveLength(0);
  });

  it('a tracking number in the wrong format for the carrier is refused with the format (422)', async () => {
    const claim = await approvedClaim({ failedPart: 'TV-DU60' });
    await setStock('torvane', 'TV-DU60', 5);
    await actAs(WAREHOUSE);
    // A Skeinway number offered as a Ferrule one, a Ferrule number with a wrong check digit, nonsense.
    for (const trackingNumber of ['SK-4821-3976-G', 'FP4821397609', '12345']) {
      const res = await step(claim.id, ship(3, { tracking: 'manual', trackingNumber }));
      expect(res.status).toBe(422);
      expect(res.data.fieldErrors.trackingNumber[0]).toMatch(/Ferrule Parcel tracking number|check digit/);
    }
    expect(await claimRow(claim.id)).toMatchObject({ replacement_step: 'to_ship', version: 3 });
    expect(await bookingsFor(claim.rmaNumber)).toHaveLength(0);
    // The right format ships, with the number as typed (a label printed elsewhere), stored canonical.
    const number = ferruleNumber(Math.floor(Math.random() * 999_999_999));
    const typed = `${number.slice(0, 2).toLowerCase()} ${number.slice(2, 7)} ${number.slice(7)}`;
    const ok = await step(claim.id, ship(3, { tracking: 'manual', trackingNumber: typed }));
    expect(ok.status, JSON.stringify(ok.data)).toBe(200);
    expect((await liveOutbound(claim.id).first()).tracking_number).toBe(number);
    // The same number on another parcel is refused (the carrier knows it is in use).
    const other = await approvedClaim({ failedPart: 'TV-DU60' });
    const dup = await step(other.id, ship(3, { tracking: 'manual', trackingNumber: number }));
    expect(dup.status).toBe(422);
    expect(dup.data.error).toMatch(/already in use/);
    expect(await liveOutbound(other.id)).toHaveLength(0);
  });

  it('every line must be ticked as picked (422)', async () => {
    const claim = await approvedClaim({ failedPart: 'TV-DU60' });
    await actAs(WAREHOUSE);
    const res = await step(claim.id, ship(3, { pickedLineIds: [] }));
    expect(res.status).toBe(422);
    expect(res.data.error).toMatch(/not picked yet: 1 × TV-DU60/);
  });

  it('shipping more than stock is refused (409), the line shows back-ordered with the expected date', async () => {
    const claim = await approvedClaim({ failedPart: 'TV-CT20' });
    const partId = await setStock('torvane', 'TV-CT20', 0, '2027-01-15');
    await actAs(WAREHOUSE);
    const res = await step(claim.id, ship());
    expect(res.status).toBe(409);
    expect(res.data.error).toBe('Not enough stock to ship: TV-CT20 (0 on hand, 1 needed, more expected 2027-01-15). Nothing was shipped; the line stays back-ordered.');
    expect(await onHand(partId)).toBe(0);
    expect(await bookingsFor(claim.rmaNumber)).toHaveLength(0);
  });

  it('a lithium battery alone is not offered on a passenger-aircraft service (IATA PI 965); a freighter is fine', async () => {
    const claim = await approvedClaim({ failedPart: 'TV-BP500' });
    await setStock('torvane', 'TV-BP500', 5);
    await actAs(WAREHOUSE);
    const res = await step(claim.id, ship(3, { service: 'next_day_air' }));
    expect(res.status).toBe(422);
    expect(res.data.error).toMatch(/passenger aircraft.*UN3480.*cargo aircraft only \(IATA PI 965\)/);
    const ok = await step(claim.id, ship(3, { carrier: 'skeinway', service: 'air_freighter' }));
    expect(ok.status, JSON.stringify(ok.data)).toBe(200);
    const parcel = await liveOutbound(claim.id).first();
    expect(parcel.transport).toBe('air_cargo_aircraft');
    // By air a battery alone carries the Cargo Aircraft Only label (49 CFR 172.448; IATA PI 965, from memory).
    expect(parcel.dangerous_goods[0].marks).toContain('Cargo Aircraft Only label');
  });
});

describe('races', () => {
  it('two shipments racing for the last part: one ships, the other is refused, stock never goes below zero', async () => {
    const a = await approvedClaim({ failedPart: 'TV-DPC2' });
    const b = await approvedClaim({ failedPart: 'TV-DPC2', dealer: 'lanternhill', filedBy: 'sam.okafor@lanternhill.test' });
    const partId = await setStock('torvane', 'TV-DPC2', 1);
    await actAs(WAREHOUSE);
    const results = await Promise.all([step(a.id, ship()), step(b.id, ship())]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    const loser = results.find((r) => r.status === 409)!;
    expect(loser.data.error).toMatch(/Not enough stock|ran out/);
    expect(await onHand(partId)).toBe(0);
    const shipped = await db()('stock_movements').where({ part_id: partId, kind: 'shipment' }).whereIn('claim_id', [a.id, b.id]);
    expect(shipped).toHaveLength(1);
    const loserId = results[0]!.status === 409 ? a.id : b.id;
    const loserRma = loserId === a.id ? a.rmaNumber : b.rmaNumber;
    expect(await claimRow(loserId)).toMatchObject({ replacement_step: 'to_ship', version: 3 });
    expect(await liveOutbound(loserId)).toHaveLength(0);
    // Whatever the loser booked was handed back to the carrier.
    expect((await bookingsFor(loserRma)).filter((s) => !s.cancelledAt)).toHaveLength(0);
  });

  it('the database itself refuses a negative stock level', async () => {
    const partId = await setStock('torvane', 'TV-CH4', 1);
    await expect(db()('stock_levels').where({ part_id: partId }).update({ on_hand: -1 })).rejects.toThrow(/stock_levels_not_negative/);
    expect(await onHand(partId)).toBe(1);
  });

  it('a double-clicked Ship sends two requests: one parcel, one booking, one unit taken', async () => {
    const claim = await approvedClaim({ failedPart: 'TV-CH4' });
    const partId = await setStock('torvane', 'TV-CH4', 4);
    await actAs(WAREHOUSE);
    const results = await Promise.all([step(claim.id, ship()), step(claim.id, ship())]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    expect(await onHand(partId)).toBe(3);
    expect(await liveOutbound(claim.id)).toHaveLength(1);
    expect((await bookingsFor(claim.rmaNumber)).filter((s) => !s.cancelledAt)).toHaveLength(1);
  });
});
