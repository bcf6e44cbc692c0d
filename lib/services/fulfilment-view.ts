import 'server-only';
import type { ClockResult } from '@/lib/calendar';
import { brandHolidays, findPart, findPolicy, type PartCategory } from '@/lib/db/catalog';
import type { ClaimRecord } from '@/lib/db/claims';
import { formatDay } from '@/lib/format/dates';
import { organisationAddress } from '@/lib/db/fulfilment';
import { liveShipments, shipmentEvents, type Shipment, type ShipmentEvent } from '@/lib/db/shipments';
import { stockLevelsFor } from '@/lib/db/stock';
import {
  classifyPart,
  coreClock,
  coreTrack,
  lineAvailability,
  linesFromDealerStock,
  linesToShip,
  replacementTrack,
  serviceOffers,
  storedClass,
  type LineAvailability,
  type ParcelSummary,
  type ServiceOffer,
  type StoredBatteryClass,
  type TrackStep,
} from '@/lib/fulfilment';
import { corePart, partLinesOf } from '@/lib/services/fulfilment';
import type { CoreState, ReplacementState } from '@/machines/claim';

const FULFILMENT_STAGES = ['approved', 'credit_pending', 'credited', 'reconciled'];

export type ParcelView = Shipment & { events: ShipmentEvent[] };

export type FulfilmentView = {
  replacementStep: ReplacementState;
  coreStep: CoreState;
  outbound: ParcelView | null;
  returnParcel: ParcelView | null;
  availability: LineAvailability[];
  dealerStockLines: { partNumber: string; name: string; quantity: number }[];
  coreIsBattery: boolean;
  corePartLabel: string | null;
  coreClock: ClockResult | null;
  replacementSteps: TrackStep[];
  coreSteps: TrackStep[];
  /** Classifications for the warehouse's forms (sound ground shipments; a damaged core for the label form). */
  outboundBatteries: StoredBatteryClass[];
  outboundOffers: ServiceOffer[];
  /** Every service, for a parcel without batteries. */
  plainOffers: ServiceOffer[];
  returnOffers: { sound: ServiceOffer[]; damaged: ServiceOffer[] } | null;
  returnClasses: { sound: StoredBatteryClass; damaged: StoredBatteryClass } | null;
};

function summary(p: ParcelView | null): ParcelSummary | null {
  if (!p) return null;
  return {
    carrier: p.carrier, trackingNumber: p.trackingNumber, trackingStatus: p.trackingStatus,
    handedOverAt: p.handedOverAt ? new Date(p.handedOverAt).toISOString() : null,
    deliveredAt: p.deliveredAt ? new Date(p.deliveredAt).toISOString() : null,
    createdAt: new Date(p.createdAt).toISOString(),
  };
}

/** Where the replacement and the core stand, for the claim page and the warehouse's work screen. */
export async function loadFulfilmentView(claim: ClaimRecord): Promise<FulfilmentView | null> {
  if (!FULFILMENT_STAGES.includes(claim.stage)) return null;
  const ctx = claim.context;
  const replacementStep: ReplacementState = (claim.replacementStep as ReplacementState | null) ?? 'verified';
  const coreStep: CoreState =
    (claim.coreStep as CoreState | null) ?? (ctx.core.outcome === 'open' ? 'inspected' : (ctx.core.outcome as CoreState));

  const shipments = await liveShipments(claim.id);
  const events = await shipmentEvents(shipments.map((s) => s.id));
  const withEvents = (s: Shipment | undefined): ParcelView | null => (s ? { ...s, events: events.filter((e) => e.shipmentId === s.id) } : null);
  const outbound = withEvents(shipments.find((s) => s.direction === 'outbound'));
  const returnParcel = withEvents(shipments.find((s) => s.direction === 'return'));

  const lines = partLinesOf(claim);
  const toShip = linesToShip(lines);
  const stock = await stockLevelsFor(claim.brandId, toShip.map((l) => l.partId));
  const availability = replacementStep === 'to_ship' ? lineAvailability(toShip, stock) : [];
  const short = availability.filter((a) => !a.inStock);
  const backordered = short.length
    ? `Back-ordered: ${short.map((a) => `${a.partNumber}${a.expectedOn ? `, expected ${formatDay(a.expectedOn)}` : ', date to follow'}`).join('; ')}`
    : null;

  const part = await corePart(claim);
  const coreIsBattery = part?.category === 'battery';

  let clock: ClockResult | null = null;
  // The return clock starts when the replacement arrives; with nothing shipped, when the claim was approved.
  const clockStart = outbound?.deliveredAt ?? (ctx.replacement.fromShopStock ? ctx.decision?.at : null);
  if (clockStart && coreStep === 'requested') {
    const [org, holidays, policy] = await Promise.all([
      organisationAddress(claim.brandId),
      brandHolidays(claim.brandId),
      claim.partCategory ? findPolicy(claim.brandId, claim.partCategory as PartCategory) : Promise.resolve(null),
    ]);
    const deliveredAt = new Date(clockStart).toISOString();
    const now = new Date(Math.max(Date.now(), Date.parse(deliveredAt))).toISOString();
    clock = coreClock({
      deliveredAt, now, timeZone: org?.timeZone ?? 'UTC', calendar: { holidays },
      policy: { returnDays: policy?.coreReturnDays ?? 15, graceDays: policy?.coreGraceDays ?? 5 },
    });
  }

  const outboundClasses = [];
  for (const l of toShip) {
    const p = await findPart(claim.brandId, l.partId);
    const c = p ? classifyPart(p, { direction: 'outbound', condition: 'sound' }) : null;
    if (c) outboundClasses.push({ line: l, c });
  }

  let returnOffers: FulfilmentView['returnOffers'] = null;
  let returnClasses: FulfilmentView['returnClasses'] = null;
  if (part && coreIsBattery) {
    const sound = classifyPart(part, { direction: 'return', condition: 'sound' })!;
    const damaged = classifyPart(part, { direction: 'return', condition: 'damaged_or_defective' })!;
    returnOffers = { sound: serviceOffers([sound]), damaged: serviceOffers([damaged]) };
    returnClasses = { sound: storedClass(part.partNumber, 1, sound), damaged: storedClass(part.partNumber, 1, damaged) };
  }

  return {
    replacementStep,
    coreStep,
    outbound,
    returnParcel,
    availability,
    dealerStockLines: linesFromDealerStock(lines).map((l) => ({ partNumber: l.partNumber, name: l.name, quantity: l.quantity })),
    coreIsBattery,
    corePartLabel: part ? `${part.partNumber} ${part.name}` : null,
    coreClock: clock,
    replacementSteps: replacementTrack(replacementStep, ctx, summary(outbound), backordered, linesFromDealerStock(lines).length > 0),
    coreSteps: coreTrack(coreStep, ctx, summary(returnParcel), clock?.dueDate ?? outbound?.coreDueOn ?? null),
    outboundBatteries: outboundClasses.map(({ line, c }) => storedClass(line.partNumber, line.quantity, c)),
    outboundOffers: serviceOffers(outboundClasses.map(({ c }) => c)),
    plainOffers: serviceOffers([]),
    returnOffers,
    returnClasses,
  };
}
