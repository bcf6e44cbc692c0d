import 'server-only';
import { localDate } from '@/lib/calendar';
import { CARRIERS, carrierName, findService, isCarrierCode } from '@/lib/carrier';
import { findPart } from '@/lib/db/catalog';
import { findClaimForUser } from '@/lib/db/claims';
import { organisationAddress, type OrgAddress } from '@/lib/db/fulfilment';
import { findShipmentForUser, liveShipment } from '@/lib/db/shipments';
import type { AppUser } from '@/lib/db/users';
import { renderPackingSlip, type SlipAddress } from '@/lib/documents/packing-slip';
import { ConflictError, ForbiddenError, NotFoundError } from '@/lib/errors';
import { formatDateTime, formatDay } from '@/lib/format/dates';
import { classifyPart, linesFromDealerStock, linesToShip, nothingShipsText, storedClass, type StoredBatteryClass } from '@/lib/fulfilment';
import { corePart, partLinesOf } from '@/lib/services/fulfilment';
import { getObjectBytes } from '@/lib/storage/s3';

const address = (a: OrgAddress): SlipAddress => ({ name: a.name, line: a.line, city: a.city, postcode: a.postcode, country: a.country });

/**
 * The packing slip PDF for a claim: the warehouse prints it from approval on (as a pick list until
 * the parcel is booked); the dealer may print it once the replacement has shipped.
 */
export async function packingSlipFor(user: AppUser, claimId: string): Promise<{ fileName: string; pdf: Buffer }> {
  const claim = await findClaimForUser(user, claimId);
  if (!claim) throw new NotFoundError('No such claim.');
  if (!claim.rmaNumber) throw new ConflictError('There is no packing slip before the claim is approved and has an RMA number.', { stage: claim.stage });
  if (claim.context.replacement.fromShopStock) {
    throw new ConflictError(`There is no packing slip. ${nothingShipsText(partLinesOf(claim), 'brand')}`, { stage: claim.stage });
  }
  const outbound = await liveShipment(claim.id, 'outbound');
  if (user.orgKind === 'dealer' && !outbound) throw new ConflictError('The packing slip is ready once the replacement has shipped.', { stage: claim.stage });

  const [brand, dealer] = await Promise.all([organisationAddress(claim.brandId), organisationAddress(claim.dealerId)]);
  if (!brand || !dealer) throw new Error(`claim ${claim.id}: address missing`);
  const lines = partLinesOf(claim);
  const toShip = outbound ? outbound.lines : linesToShip(lines);
  const batteries: StoredBatteryClass[] = outbound?.dangerousGoods ? [...outbound.dangerousGoods] : [];
  if (!outbound) {
    for (const l of toShip) {
      const p = await findPart(claim.brandId, l.partId);
      const c = p ? classifyPart(p, { direction: 'outbound', condition: 'sound' }) : null;
      if (c) batteries.push(storedClass(l.partNumber, l.quantity, c));
    }
  }
  const core = await corePart(claim);
  const service = outbound ? findService(outbound.carrier, outbound.service) : null;

  const pdf = await renderPackingSlip({
    rmaNumber: claim.rmaNumber,
    claimNumber: claim.number,
    accountNumber: claim.accountNumber,
    from: address(brand),
    shipTo: address(dealer),
    shipment: outbound
      ? {
          carrier: carrierName(outbound.carrier),
          service: service?.name ?? outbound.service,
          trackingNumber: outbound.trackingNumber,
          shippedOn: formatDay(localDate(new Date(outbound.handedOverAt ?? outbound.createdAt).toISOString(), brand.timeZone)),
        }
      : null,
    lines: toShip.map((l) => ({ partNumber: l.partNumber, name: l.name, quantity: l.quantity })),
    dealerStockLines: linesFromDealerStock(lines).map((l) => ({ partNumber: l.partNumber, name: l.name, quantity: l.quantity })),
    batteries: batteries.map((b) => ({ partNumber: b.partNumber, unNumber: b.unNumber, properShippingName: b.properShippingName, watthours: b.watthours, fullyRegulated: b.fullyRegulated, marks: b.marks })),
    batteryCautions: batteries[0]?.cautions.slice(0, 3) ?? [],
    core: { partNumber: core?.partNumber ?? claim.partNumber, partName: core?.name ?? claim.partName, serial: claim.partSerial },
    printedAt: formatDateTime(new Date(), user.timeZone),
  });
  return { fileName: `packing-slip-${claim.rmaNumber}.pdf`, pdf };
}

/** A parcel's label PDF: the warehouse's for both parcels, the dealer's for the prepaid return only. */
export async function labelFor(user: AppUser, shipmentId: string): Promise<{ fileName: string; pdf: Buffer }> {
  const s = await findShipmentForUser(user, shipmentId);
  if (!s || s.voidedAt) throw new NotFoundError('No such label.');
  if (user.orgKind === 'dealer' && s.direction !== 'return') throw new ForbiddenError('The outbound label is the warehouse’s; your label is the prepaid return label.');
  if (!s.labelKey) throw new NotFoundError('This parcel was labelled outside Loadproof; there is no label to print here.');
  const carrier = isCarrierCode(s.carrier) ? CARRIERS[s.carrier].code : 'carrier';
  return { fileName: `${s.direction === 'return' ? 'return-label' : 'label'}-${carrier}-${s.trackingNumber}.pdf`, pdf: await getObjectBytes(s.labelKey) };
}
