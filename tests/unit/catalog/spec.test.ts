import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { batteryEnergy, describeSpec, specInputValue, specToSi } from '@/lib/catalog';
import { modelSchema, partSchema, policySchema, registryQuerySchema } from '@/lib/validation/catalog';

describe('spec values typed in imperial units are stored in SI at the column precision', () => {
  it('horsepower and pound-force foot convert by NIST SP 811 App. B.9 (1 hp = 745.699 872 W; 1 lbf·ft = 1.355 818 N·m)', () => {
    expect(specToSi.power(1, 'hp')).toBe(745.7);
    expect(specToSi.torque(1, 'lbft')).toBe(1.36);
    expect(specToSi.torque(63, 'lbft')).toBe(85.42); // 63 × 1.355 818 = 85.416 5
    expect(specToSi.mass(10, 'lb')).toBe(4.54); // 0.453 592 37 kg/lb exact (NIST SP 811 B.9)
  });

  it('agrees with mathjs units as an independent reference', () => {
    for (const v of [0.25, 0.5, 1.3]) expect(specToSi.power(v, 'hp')).toBeCloseTo(unit(v, 'hp').toNumber('W'), 1);
    for (const v of [10, 20, 44.3]) expect(specToSi.torque(v, 'lbft')).toBeCloseTo(unit(v, 'lbf ft').toNumber('N m'), 2);
  });

  it('an edit form shows enough digits that saving it again stores the same value', () => {
    for (const w of [250, 300, 372.8, 550]) expect(specToSi.power(Number(specInputValue('power', w, 'hp')), 'hp')).toBe(w);
    for (const nm of [18, 24, 27.12, 35]) expect(specToSi.torque(Number(specInputValue('torque', nm, 'lbft')), 'lbft')).toBe(nm);
    expect(specInputValue('power', 300, 'w')).toBe('300');
    expect(specInputValue('power', null, 'w')).toBe('');
  });
});

describe('battery rated energy', () => {
  it('is V × Ah (49 CFR 171.8) and above 100 Wh ships fully regulated (49 CFR 173.185(c))', () => {
    expect(batteryEnergy(36, 17.4)).toEqual({ wh: 626.4, text: '626.4 Wh', fullyRegulated: true });
    expect(batteryEnergy(36, 2.6)).toMatchObject({ wh: 93.6, fullyRegulated: false });
    // The boundary: exactly 100 Wh is not above it.
    expect(batteryEnergy(40, 2.5)).toMatchObject({ wh: 100, fullyRegulated: false });
    expect(batteryEnergy(null, 10)).toBeNull();
  });

  it('is described with the dyno spec in the reader’s units', () => {
    expect(describeSpec({ minWheelPowerW: 300, minWheelTorqueNm: 24, ratedCapacityAh: null, nominalVoltageV: null }, 'metric')).toEqual(['≥ 300 W at the wheel', '≥ 24.0 N·m at the wheel']);
    expect(describeSpec({ minWheelPowerW: 300, minWheelTorqueNm: 24, ratedCapacityAh: null, nominalVoltageV: null }, 'imperial')).toEqual(['≥ 0.40 hp at the wheel', '≥ 17.7 lbf·ft at the wheel']);
    expect(describeSpec({ minWheelPowerW: null, minWheelTorqueNm: null, ratedCapacityAh: 13.9, nominalVoltageV: 36 }, 'imperial')).toEqual(['36 V × 13.9 Ah = 500.4 Wh']);
  });
});

describe('catalog form schemas', () => {
  it('a part keeps the unit it was typed in out of storage, and a controller may have a dyno spec', () => {
    const r = partSchema.parse({ partNumber: 'X-1', name: 'Controller', category: 'controller', minWheelTorque: '20', torqueUnit: 'lbft', active: 'on' });
    expect(r).toMatchObject({ minWheelPowerW: null, minWheelTorqueNm: 27.12, active: true, ratedCapacityAh: null });
    expect(partSchema.safeParse({ partNumber: 'X-1', name: 'Display', category: 'display', minWheelPower: '10' }).success).toBe(false);
    expect(partSchema.safeParse({ partNumber: 'bad number!', name: 'Display', category: 'display' }).success).toBe(false);
  });

  it('a model stores the ISO 5775 designation of the tyre (ISO 5775-1: 700C = 622 mm bead seat)', () => {
    expect(modelSchema.parse({ code: 'M-1', name: 'Model', legalClass: 'us_class3', tyreSize: '700 x 35C' })).toMatchObject({ tyreSize: '35-622', active: false });
  });

  it('a policy reads its exclusions from checkboxes and ignores unknown ones', () => {
    const r = policySchema.parse({ category: 'display', coverageMonths: '12', coreReturnDays: '20', coreGraceDays: '0', reviewDays: '4', appealDays: '21', exclusion_crash_damage: 'on', exclusion_zzz: 'on', exclusion_wear_item: 'off' });
    expect(r.exclusions).toEqual(['crash_damage']);
    expect(r.coreGraceDays).toBe(0);
  });
});

describe('the registry page’s address bar', () => {
  it('reads any query without refusing it', () => {
    expect(registryQuerySchema.parse({})).toEqual({ q: undefined, page: 1 });
    expect(registryQuerySchema.parse({ q: ['KT25', 'x'], page: ['3', '4'] })).toEqual({ q: 'KT25', page: 3 });
    expect(registryQuerySchema.parse({ q: '  ', page: '-2' })).toEqual({ q: undefined, page: 1 });
    expect(registryQuerySchema.parse({ q: 'x'.repeat(200), page: 'abc' })).toEqual({ q: 'x'.repeat(60), page: 1 });
  });
});
