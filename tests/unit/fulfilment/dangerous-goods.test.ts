import { describe, expect, it } from 'vitest';
import { findService } from '@/lib/carrier/carriers';
import { chosenServiceProblem, classifyPart, declarationOf, serviceOffers, serviceProblem } from '@/lib/fulfilment';
import { classifyLithiumShipment } from '@/lib/shipping';

const BP500 = { partNumber: 'TV-BP500', category: 'battery', ratedCapacityAh: 13.9, nominalVoltageV: 36 };
const RX26 = { partNumber: 'WF-RX26', category: 'battery', ratedCapacityAh: 2.6, nominalVoltageV: 36 };
const offered = (offers: ReturnType<typeof serviceOffers>) => offers.filter((o) => o.offered).map((o) => `${o.carrier}/${o.service.code}`);

describe('which services a parcel may use', () => {
  it('a part that is not a battery: every service', () => {
    expect(classifyPart({ partNumber: 'TV-DU85', category: 'drive_unit', ratedCapacityAh: null, nominalVoltageV: null }, { direction: 'outbound', condition: 'sound' })).toBeNull();
    expect(offered(serviceOffers([]))).toEqual(['ferrule/road', 'ferrule/next_day_air', 'skeinway/ground', 'skeinway/air_freighter']);
  });

  it('a sound 500.4 Wh battery alone (UN3480): ground, or a freighter; never a passenger-aircraft service (IATA PI 965)', () => {
    const c = classifyPart(BP500, { direction: 'outbound', condition: 'sound' })!;
    expect(c.watthours).toBe(500.4); // 36 V × 13.9 Ah (49 CFR 171.8)
    const offers = serviceOffers([c]);
    expect(offered(offers)).toEqual(['ferrule/road', 'skeinway/ground', 'skeinway/air_freighter']);
    expect(offers.find((o) => o.service.code === 'next_day_air')!.reason).toMatch(/passenger aircraft.*\(UN3480\) are cargo aircraft only \(IATA PI 965\)/);
  });

  it('a sound 93.6 Wh battery alone is still UN3480: no passenger aircraft either (IATA PI 965)', () => {
    const c = classifyPart(RX26, { direction: 'outbound', condition: 'sound' })!;
    expect(c.watthours).toBe(93.6);
    expect(c.smallBatteryProvisions).toBe(true); // ≤ 100 Wh (49 CFR 173.185(c))
    expect(offered(serviceOffers([c]))).toEqual(['ferrule/road', 'skeinway/ground', 'skeinway/air_freighter']);
  });

  it('a damaged or defective core: ground only, whatever its size (IATA SP A154; 49 CFR 173.185(f))', () => {
    for (const part of [BP500, RX26]) {
      const c = classifyPart(part, { direction: 'return', condition: 'damaged_or_defective' })!;
      expect(c.specialPackagingRequired).toBe(true);
      const offers = serviceOffers([c]);
      expect(offered(offers)).toEqual(['ferrule/road', 'skeinway/ground']);
      expect(offers.find((o) => o.service.code === 'air_freighter')!.reason).toMatch(/may not travel by air \(IATA special provision A154\)/);
    }
  });

  it('the carrier’s own rule comes on top: fully regulated lithium stays off Ferrule’s next-day air even where the rules allow it', () => {
    // A 500 Wh battery packed with its equipment (UN3481) may fly on passenger aircraft within limits (IATA PI 966, from memory).
    const c = classifyLithiumShipment({ nominalVoltageV: 36, ratedCapacityAh: 13.9, packing: 'with_equipment', condition: 'sound', mode: 'air' });
    expect(c.passengerAircraftAllowed).toBe(true);
    expect(serviceProblem(findService('ferrule', 'next_day_air')!, [c])).toMatch(/the carrier does not take fully regulated Class 9 lithium batteries/);
    expect(serviceProblem(findService('skeinway', 'air_freighter')!, [c])).toBeNull();
  });

  it('an unknown carrier or service is refused in words', () => {
    expect(chosenServiceProblem('ferrule', 'teleport', [])).toMatch(/Choose a carrier and one of its services/);
    expect(chosenServiceProblem('owl-post', 'road', [])).toMatch(/Choose a carrier/);
  });

  it('a battery without its rated capacity or voltage cannot be classified, and says what is missing', () => {
    expect(() => classifyPart({ ...BP500, ratedCapacityAh: null }, { direction: 'outbound', condition: 'sound' })).toThrow(/no rated capacity or nominal voltage/);
  });

  it('declares to the carrier what the rules found; confirmation only counts for a damaged battery', () => {
    const sound = classifyPart(BP500, { direction: 'return', condition: 'sound' })!;
    const damaged = classifyPart(BP500, { direction: 'return', condition: 'damaged_or_defective' })!;
    expect(declarationOf('TV-BP500', sound, true)).toEqual({ unNumber: 'UN3480', properShippingName: 'Lithium ion batteries', watthours: 500.4, fullyRegulated: true, damaged: false, specialPackagingConfirmed: false });
    expect(declarationOf('TV-BP500', damaged, true)).toMatchObject({ damaged: true, specialPackagingConfirmed: true });
    // Air marks for a battery alone: Cargo Aircraft Only (49 CFR 172.448; IATA PI 965, paragraph from memory).
    expect(classifyPart(BP500, { direction: 'outbound', condition: 'sound', transport: 'air_cargo_aircraft' })!.marks).toContain('Cargo Aircraft Only label');
    expect(classifyPart(BP500, { direction: 'outbound', condition: 'sound', transport: 'ground' })!.marks).not.toContain('Cargo Aircraft Only label');
  });
});
