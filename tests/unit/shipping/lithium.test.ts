import fc from 'fast-check';
import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { allowedServices, classifyLithiumShipment, ShippingInputError, watthourRating, type LithiumShipmentInput } from '@/lib/shipping';

const refs = (c: ReturnType<typeof classifyLithiumShipment>) => c.rules.map((r) => r.ref);
const sound = (nominalVoltageV: number, ratedCapacityAh: number, packing: LithiumShipmentInput['packing'] = 'alone'): LithiumShipmentInput => ({
  nominalVoltageV,
  ratedCapacityAh,
  packing,
  condition: 'sound',
});

describe('watt-hour rating (49 CFR 171.8: Wh = rated capacity in Ah × nominal voltage)', () => {
  it('36 V × 13.9 Ah = 500.4 Wh (49 CFR 171.8; cross-checked with mathjs units V·Ah → Wh)', () => {
    expect(watthourRating(36, 13.9)).toBe(500.4);
    expect(watthourRating(36, 13.9)).toBe(unit(36, 'V').multiply(unit(13.9, 'Ah')).toNumber('Wh'));
  });

  it('agrees with mathjs for any plausible e-bike pack (property, mathjs units)', () => {
    fc.assert(
      fc.property(fc.double({ min: 12, max: 72, noNaN: true }), fc.double({ min: 0.5, max: 40, noNaN: true }), (v, ah) => {
        expect(watthourRating(v, ah)).toBeCloseTo(unit(v, 'V').multiply(unit(ah, 'Ah')).toNumber('Wh'), 5);
      }),
    );
  });

  it('refuses impossible values, naming the field', () => {
    expect(() => watthourRating(0, 10)).toThrow(/nominalVoltageV: expected a number of V above 0, got 0/);
    expect(() => watthourRating(36, -2)).toThrow(/ratedCapacityAh: expected a number of Ah above 0/);
    expect(() => watthourRating(Number.NaN, 2)).toThrow(ShippingInputError);
    expect(() => watthourRating(36000, 2)).toThrow(/nominalVoltageV: 36000 V is not plausible/);
  });
});

describe('size: small-battery provisions at ≤ 100 Wh, fully regulated Class 9 above (49 CFR 173.185(c))', () => {
  it('99 Wh (36 V × 2.75 Ah) alone: UN3480 under the small-battery provisions of 49 CFR 173.185(c)', () => {
    const c = classifyLithiumShipment(sound(36, 2.75));
    expect(c.watthours).toBe(99);
    expect([c.unNumber, c.properShippingName, c.hazardClass]).toEqual(['UN3480', 'Lithium ion batteries', '9']);
    expect(c.fullyRegulatedClass9).toBe(false);
    expect(c.smallBatteryProvisions).toBe(true);
    expect(refs(c)).toContain('49 CFR 173.185(c)');
    expect(c.marks).toEqual(['Lithium battery mark with UN3480 and a telephone number']);
    expect(c.markDetails[0]?.fromMemory).toBe(true);
  });

  it('exactly 100 Wh (40 V × 2.5 Ah) is still small (49 CFR 173.185(c): "100 Wh or less" per battery)', () => {
    const c = classifyLithiumShipment(sound(40, 2.5));
    expect(c.watthours).toBe(100);
    expect(c.fullyRegulatedClass9).toBe(false);
  });

  it('100.1 Wh (36.4 V × 2.75 Ah) is fully regulated Class 9 (49 CFR 173.185(c) no longer applies)', () => {
    const c = classifyLithiumShipment(sound(36.4, 2.75));
    expect(c.watthours).toBe(100.1);
    expect(c.fullyRegulatedClass9).toBe(true);
    expect(c.rules.find((r) => r.ref === '49 CFR 173.185(c)')?.text).toBe('100.1 Wh is above 100 Wh per battery: the small-battery provisions do not apply; fully regulated Class 9.');
    expect(c.marks).toContain('Class 9 lithium battery hazard label');
    expect(c.marks).toContain('UN3480 Lithium ion batteries (UN number and proper shipping name)');
  });

  it('a cell above 20 Wh makes even a 99 Wh battery fully regulated (49 CFR 173.185(c), 20 Wh per cell)', () => {
    expect(classifyLithiumShipment({ ...sound(36, 2.75), cellWatthours: 21 }).fullyRegulatedClass9).toBe(true);
    expect(classifyLithiumShipment({ ...sound(36, 2.75), cellWatthours: 20 }).fullyRegulatedClass9).toBe(false);
  });

  it('500.4 Wh alone, sound: UN3480 fully regulated; by air cargo aircraft only at ≤ 30 % charge (IATA PI 965)', () => {
    const c = classifyLithiumShipment({ ...sound(36, 13.9), mode: 'air' });
    expect(c.unNumber).toBe('UN3480');
    expect(c.fullyRegulatedClass9).toBe(true);
    expect(c.airAllowed).toBe(true);
    expect(c.passengerAircraftAllowed).toBe(false);
    expect(c.allowedServices).toEqual(['ground', 'air_cargo_aircraft']);
    expect(c.airReasons[0]).toMatch(/forbidden on passenger aircraft: cargo aircraft only, at a state of charge of 30 % or less \(IATA PI 965\)/);
    expect(refs(c)).toContain('IATA PI 965');
    expect(c.marks).toContain('Cargo Aircraft Only label');
    expect(c.cautions.join(' ')).toMatch(/state of charge of 30 % or less/);
  });

  it('by air above 30 % charge a battery alone may not fly; at 30 % it may (IATA PI 965)', () => {
    const high = classifyLithiumShipment({ ...sound(36, 13.9), mode: 'air', stateOfChargePct: 50 });
    expect([high.airAllowed, high.requestedModeAllowed]).toEqual([false, false]);
    expect(high.allowedServices).toEqual(['ground']);
    expect(high.airReasons[1]).toBe('State of charge 50 % is above 30 %: discharge the battery before an air shipment (IATA PI 965).');
    expect(classifyLithiumShipment({ ...sound(36, 13.9), mode: 'air', stateOfChargePct: 30 }).airAllowed).toBe(true);
  });
});

describe('alone vs with equipment (49 CFR 172.101: UN3480 / UN3481)', () => {
  it('500 Wh packed with equipment: UN3481, passenger aircraft within limits (IATA PI 966, from memory)', () => {
    const c = classifyLithiumShipment(sound(50, 10, 'with_equipment'));
    expect([c.unNumber, c.properShippingName]).toEqual(['UN3481', 'Lithium ion batteries packed with equipment']);
    expect(c.fullyRegulatedClass9).toBe(true);
    expect(c.passengerAircraftAllowed).toBe(true);
    expect(c.allowedServices).toEqual(['ground', 'air_cargo_aircraft', 'air_passenger_aircraft']);
    expect(c.rules.find((r) => r.ref === 'IATA PI 966')?.fromMemory).toBe(true);
  });

  it('contained in equipment: UN3481 (IATA PI 967, from memory); 99 Wh uses the small-battery mark', () => {
    const c = classifyLithiumShipment(sound(36, 2.75, 'in_equipment'));
    expect([c.unNumber, c.properShippingName]).toEqual(['UN3481', 'Lithium ion batteries contained in equipment']);
    expect(refs(c)).toContain('IATA PI 967');
    expect(c.marks).toEqual(['Lithium battery mark with UN3481 and a telephone number']);
  });

  it('a whole e-bike is UN3171, battery-powered vehicle (49 CFR 173.220 and IATA PI 952, from memory)', () => {
    const c = classifyLithiumShipment(sound(36, 13.9, 'vehicle'));
    expect([c.unNumber, c.properShippingName]).toEqual(['UN3171', 'Battery-powered vehicle']);
    expect(c.fullyRegulatedClass9).toBe(true);
    expect(c.passengerAircraftAllowed).toBe(false);
    expect(c.rules.filter((r) => ['49 CFR 173.220', 'IATA PI 952'].includes(r.ref)).every((r) => r.fromMemory)).toBe(true);
    expect(c.rules.some((r) => r.text.includes('UN3556'))).toBe(true);
    expect(c.cautions.join(' ')).toMatch(/motor cannot start in transit/);
  });
});

describe('damaged or defective (49 CFR 173.185(f); PHMSA interpretation 24-0050; IATA SP A154)', () => {
  const damaged = (packing: LithiumShipmentInput['packing'], v = 36, ah = 13.9): LithiumShipmentInput => ({ nominalVoltageV: v, ratedCapacityAh: ah, packing, condition: 'damaged_or_defective' });

  it('500.4 Wh damaged core alone: special packaging under 173.185(f), ground only, no air (IATA SP A154)', () => {
    const c = classifyLithiumShipment({ ...damaged('alone'), mode: 'air', direction: 'return' });
    expect(c.specialPackagingRequired).toBe(true);
    expect(refs(c)).toContain('49 CFR 173.185(f); PHMSA interpretation 24-0050');
    expect(refs(c)).toContain('IATA DGR special provision A154; PHMSA guidance');
    expect(c.airAllowed).toBe(false);
    expect(c.passengerAircraftAllowed).toBe(false);
    expect(c.requestedModeAllowed).toBe(false);
    expect(c.allowedServices).toEqual(['ground']);
    expect(c.airReasons).toEqual(['Damaged or defective lithium batteries are forbidden by air (IATA special provision A154; PHMSA guidance).']);
    expect(c.marks).toContain('"DAMAGED/DEFECTIVE LITHIUM ION BATTERIES"');
    expect(c.packagingSteps[0]).toMatch(/own non-metallic inner packaging/);
    // Packaging details are from memory and flagged so.
    expect(c.rules.filter((r) => r.text.startsWith('Packaging:')).every((r) => r.fromMemory)).toBe(true);
    expect(c.cautions.join(' ')).toMatch(/hot, swollen, smoking, venting or leaking, do not ship it/);
  });

  it('a 99 Wh damaged battery gets no small-battery provisions (173.185(f); that detail from memory)', () => {
    const c = classifyLithiumShipment(damaged('alone', 36, 2.75));
    expect(c.watthours).toBe(99);
    expect(c.smallBatteryProvisions).toBe(false);
    expect(c.fullyRegulatedClass9).toBe(true);
    expect(c.specialPackagingRequired).toBe(true);
    expect(c.rules.find((r) => r.text.startsWith('The small-battery provisions do not apply to a damaged'))?.fromMemory).toBe(true);
  });

  it('damaged with or in equipment, or in a whole e-bike, may not fly either (IATA SP A154)', () => {
    for (const packing of ['with_equipment', 'in_equipment', 'vehicle'] as const) {
      expect(allowedServices(damaged(packing))).toEqual(['ground']);
    }
    expect(classifyLithiumShipment(damaged('vehicle')).cautions.join(' ')).toMatch(/Take a damaged or defective battery out of the e-bike/);
  });

  it('sound vs damaged differ only where the rules say', () => {
    const ok = classifyLithiumShipment(sound(36, 13.9));
    const bad = classifyLithiumShipment(damaged('alone'));
    expect([ok.unNumber, ok.watthours]).toEqual([bad.unNumber, bad.watthours]);
    expect([ok.specialPackagingRequired, bad.specialPackagingRequired]).toEqual([false, true]);
    expect([ok.airAllowed, bad.airAllowed]).toEqual([true, false]);
  });
});

describe('every shipment carries the standard cautions and rules', () => {
  it('cautions: terminals, inner packaging and cushioning, trained shipper, defer to carrier and local rules', () => {
    const text = classifyLithiumShipment(sound(36, 13.9)).cautions.join(' ');
    for (const phrase of [/short circuit/, /non-conductive inner packaging with cushioning/, /trained and certified for dangerous goods/, /carrier's rules, local regulations/]) expect(text).toMatch(phrase);
  });

  it('UN 38.3 test summary (paragraph from memory) and Wh rule (49 CFR 171.8) are cited', () => {
    const c = classifyLithiumShipment(sound(36, 13.9));
    const un383 = c.rules.find((r) => r.ref.includes('38.3'));
    expect(un383?.fromMemory).toBe(true);
    expect(c.rules[0]).toEqual({ ref: '49 CFR 171.8', text: 'Watt-hour rating = nominal voltage × rated capacity: 36 V × 13.9 Ah = 500.4 Wh.', fromMemory: false });
  });

  it('a sound returned core gets the note on when to treat it as damaged', () => {
    expect(classifyLithiumShipment({ ...sound(36, 13.9), direction: 'return' }).cautions.join(' ')).toMatch(/When unsure, ship it as damaged/);
  });

  it('refuses bad choices, naming the field', () => {
    expect(() => classifyLithiumShipment({ ...sound(36, 13.9), packing: 'loose' as never })).toThrow(/packing: "loose"; expected one of alone, with_equipment, in_equipment, vehicle/);
    expect(() => classifyLithiumShipment({ nominalVoltageV: 36, ratedCapacityAh: 13.9, packing: 'alone' } as never)).toThrow(/condition: missing; expected one of sound, damaged_or_defective/);
    expect(() => classifyLithiumShipment({ ...sound(36, 13.9), mode: 'sea' as never })).toThrow(/mode: "sea"/);
    expect(() => classifyLithiumShipment({ ...sound(36, 13.9), stateOfChargePct: 120 })).toThrow(/stateOfChargePct: expected 0–100 %, got 120/);
    expect(() => classifyLithiumShipment({ ...sound(36, 2.75), cellWatthours: 150 })).toThrow(/cellWatthours: 150 Wh per cell is more than the whole battery \(99 Wh\)/);
  });
});

describe('classification properties (fast-check)', () => {
  const shipment = fc.record({
    nominalVoltageV: fc.double({ min: 12, max: 72, noNaN: true }),
    ratedCapacityAh: fc.double({ min: 0.5, max: 40, noNaN: true }),
    packing: fc.constantFrom('alone', 'with_equipment', 'in_equipment', 'vehicle' as const),
    condition: fc.constantFrom('sound', 'damaged_or_defective' as const),
  });

  it('damaged never flies, UN3480 never on passenger aircraft, ground always allowed', () => {
    fc.assert(
      fc.property(shipment, (s) => {
        const c = classifyLithiumShipment(s);
        expect(c.allowedServices[0]).toBe('ground');
        if (s.condition === 'damaged_or_defective') expect(c.allowedServices).toEqual(['ground']);
        if (c.unNumber === 'UN3480') expect(c.passengerAircraftAllowed).toBe(false);
        if (c.watthours > 100) expect(c.fullyRegulatedClass9).toBe(true);
        expect(c.specialPackagingRequired).toBe(s.condition === 'damaged_or_defective');
      }),
    );
  });
});
