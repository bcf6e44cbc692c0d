import { CARRIERS, findService, type CarrierCode, type CarrierService } from '@/lib/carrier/carriers';
import type { DangerousGoodsDeclaration } from '@/lib/carrier/client';
import { classifyLithiumShipment, type BatteryCondition, type LithiumClassification, type TransportService } from '@/lib/shipping';

export interface PartSpec {
  partNumber: string;
  category: string | null;
  ratedCapacityAh: number | null;
  nominalVoltageV: number | null;
}

export interface BatteryInParcel {
  partNumber: string;
  quantity: number;
  classification: LithiumClassification;
}

export const BATTERY_CONDITION_LABELS: Record<BatteryCondition, string> = {
  sound: 'Sound: no physical damage, swelling, water or overheating',
  damaged_or_defective: 'Damaged or defective: cracked, swollen, wet, hot or with a safety fault',
};

/**
 * Every battery shipment is classified (lib/shipping): a replacement battery goes out alone and
 * sound; a core comes back alone, sound or damaged as the shipper declares. Null for other parts.
 */
export function classifyPart(
  spec: PartSpec,
  o: { direction: 'outbound' | 'return'; condition: BatteryCondition; transport?: TransportService },
): LithiumClassification | null {
  if (spec.category !== 'battery') return null;
  if (spec.ratedCapacityAh === null || spec.nominalVoltageV === null) {
    throw new Error(`Battery ${spec.partNumber} has no rated capacity or nominal voltage in the catalog; the brand admin must add them before it can ship.`);
  }
  return classifyLithiumShipment({
    nominalVoltageV: spec.nominalVoltageV,
    ratedCapacityAh: spec.ratedCapacityAh,
    packing: 'alone',
    condition: o.condition,
    direction: o.direction,
    mode: o.transport === undefined || o.transport === 'ground' ? 'ground' : 'air',
  });
}

export interface ServiceOffer {
  carrier: CarrierCode;
  carrierName: string;
  service: CarrierService;
  offered: boolean;
  /** Why a service is not offered, in words for the shipper. */
  reason: string | null;
}

/** The refusal for sending these batteries by this service, or null: the rules first, then the carrier's own. */
export function serviceProblem(service: CarrierService, batteries: LithiumClassification[]): string | null {
  for (const c of batteries) {
    if (!c.allowedServices.includes(service.transport)) {
      if (c.specialPackagingRequired) return `${service.name} is not offered: a damaged or defective lithium battery may not travel by air (IATA special provision A154); ground only.`;
      if (c.unNumber === 'UN3480' && service.transport === 'air_passenger_aircraft') {
        return `${service.name} is not offered: it flies on passenger aircraft, and lithium ion batteries shipped alone (UN3480) are cargo aircraft only (IATA PI 965).`;
      }
      return `${service.name} is not offered for ${c.unNumber}: ${c.airReasons[0] ?? 'not allowed by the rules'}`;
    }
    if (c.fullyRegulatedClass9 && !service.takesFullyRegulatedLithium) {
      return `${service.name} is not offered: the carrier does not take fully regulated Class 9 lithium batteries on it.`;
    }
  }
  return null;
}

export function serviceOffers(batteries: LithiumClassification[]): ServiceOffer[] {
  return Object.values(CARRIERS).flatMap((carrier) =>
    carrier.services.map((service) => {
      const reason = serviceProblem(service, batteries);
      return { carrier: carrier.code, carrierName: carrier.name, service, offered: reason === null, reason };
    }),
  );
}

/** The refusal for a carrier + service choice, or null. */
export function chosenServiceProblem(carrier: string, service: string, batteries: LithiumClassification[]): string | null {
  const found = findService(carrier, service);
  if (!found) return `Choose a carrier and one of its services.`;
  return serviceProblem(found, batteries);
}

export function declarationOf(partNumber: string, c: LithiumClassification, specialPackagingConfirmed: boolean): DangerousGoodsDeclaration {
  return {
    unNumber: c.unNumber,
    properShippingName: c.properShippingName,
    watthours: c.watthours,
    fullyRegulated: c.fullyRegulatedClass9,
    damaged: c.specialPackagingRequired,
    specialPackagingConfirmed: c.specialPackagingRequired ? specialPackagingConfirmed : false,
  };
}

/** What a shipment row keeps of a classification: enough to show the marks and rules again. */
export interface StoredBatteryClass {
  partNumber: string;
  quantity: number;
  unNumber: string;
  properShippingName: string;
  watthours: number;
  fullyRegulated: boolean;
  specialPackagingRequired: boolean;
  marks: string[];
  packagingSteps: string[];
  cautions: string[];
  rules: { ref: string; text: string; fromMemory: boolean }[];
}

export function storedClass(partNumber: string, quantity: number, c: LithiumClassification): StoredBatteryClass {
  return {
    partNumber, quantity, unNumber: c.unNumber, properShippingName: c.properShippingName, watthours: c.watthours,
    fullyRegulated: c.fullyRegulatedClass9, specialPackagingRequired: c.specialPackagingRequired, marks: c.marks,
    packagingSteps: c.packagingSteps, cautions: c.cautions, rules: c.rules,
  };
}
