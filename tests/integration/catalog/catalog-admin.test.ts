import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import {
  addHolidayAction, addPriceAction, laborRateAction, removeHolidayAction, saveLaborAction, saveModelAction, savePartAction, savePolicyAction,
} from '@/app/(app)/catalog/actions';
import { db } from '@/db/connection';
import { actAs } from '../../support/acting-user';

const form = (fields: Record<string, string | undefined>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) if (v !== undefined) f.set(k, v);
  return f;
};
const run = (action: (s: undefined, f: FormData) => Promise<unknown>, fields: Record<string, string | undefined>) =>
  action(undefined, form(fields)) as Promise<{ ok?: boolean; message?: string; fieldErrors?: Record<string, string[]> }>;

const suffix = `${Date.now().toString(36)}${Math.floor(Math.random() * 1e4)}`;
const TORVANE_ADMIN = 'diego.alves@torvane.test';
const WRENFIELD_ADMIN = 'noah.quinn@wrenfield.test';

let torvane: string;
let wrenfield: string;
const brandId = async (slug: string) => (await db()('organisations').where({ slug }).first('id')).id as string;
const partRow = (partNumber: string) => db()('parts').where({ brand_id: torvane, part_number: partNumber }).first();

const OTHER_BRAND_TABLES = ['parts', 'bike_models', 'labor_operations', 'brand_holidays', 'warranty_policies', 'price_list', 'dealer_accounts'];
const otherBrandSnapshot = async () =>
  Promise.all(OTHER_BRAND_TABLES.map(async (t) => JSON.stringify(await db()(t).where({ brand_id: wrenfield }).orderByRaw('1, 2'))));
let otherBrandBefore: string[];

beforeAll(async () => {
  torvane = await brandId('torvane');
  wrenfield = await brandId('wrenfield');
  otherBrandBefore = await otherBrandSnapshot();
});

describe('parts and their load-test spec', () => {
  beforeEach(() => actAs(TORVANE_ADMIN));

  it('a drive unit typed in imperial units is stored in SI at the column precision (NIST SP 811 B.9 factors)', async () => {
    const partNumber = `TV-DU-IMP-${suffix}`;
    const r = await run(savePartAction, {
      partNumber, name: 'Drive unit, imperial test', category: 'drive_unit',
      // 0.5 hp × 745.699 872 W/hp = 372.849 936 W → 372.8 W; 20 lbf·ft × 1.355 818 N·m = 27.116 36 N·m → 27.12 N·m;
      // 7 lb × 0.453 592 37 kg/lb (exact) = 3.175 146 59 kg → 3.18 kg.
      minWheelPower: '0.5', powerUnit: 'hp', minWheelTorque: '20', torqueUnit: 'lbft', weight: '7', massUnit: 'lb', unitCost: '410.00', active: 'on',
    });
    expect(r).toMatchObject({ ok: true, message: `${partNumber} added.` });
    const row = await partRow(partNumber);
    expect(Number(row.min_wheel_power_w)).toBe(372.8);
    expect(Number(row.min_wheel_torque_nm)).toBe(27.12);
    expect(Number(row.weight_kg)).toBe(3.18);
    expect(row.unit_cost_minor).toBe(41000);
    expect(row.active).toBe(true);
  });

  it('a battery needs rated Ah and nominal V and takes no dyno spec; an edit keeps the id', async () => {
    const partNumber = `TV-BP-${suffix}`;
    const missing = await run(savePartAction, { partNumber, name: 'Test battery', category: 'battery', minWheelPower: '300' });
    expect(missing.ok).toBe(false);
    expect(missing.fieldErrors).toMatchObject({
      ratedCapacityAh: ['A battery needs its rated capacity.'],
      nominalVoltageV: ['A battery needs its nominal voltage.'],
      minWheelPower: ['Only a drive unit or controller has a dyno spec.'],
    });
    expect(await partRow(partNumber)).toBeUndefined();

    expect(await run(savePartAction, { partNumber, name: 'Test battery', category: 'battery', ratedCapacityAh: '17.4', nominalVoltageV: '36', active: 'on' })).toMatchObject({ ok: true });
    const created = await partRow(partNumber);
    expect([Number(created.rated_capacity_ah), Number(created.nominal_voltage_v)]).toEqual([17.4, 36]);

    const edited = await run(savePartAction, { id: created.id, partNumber, name: 'Test battery, renamed', category: 'battery', ratedCapacityAh: '13.9', nominalVoltageV: '36' });
    expect(edited).toMatchObject({ ok: true, message: `${partNumber} saved.` });
    const after = await partRow(partNumber);
    expect(after).toMatchObject({ id: created.id, name: 'Test battery, renamed', active: false });
    expect(Number(after.rated_capacity_ah)).toBe(13.9);
  });

  it('a drive unit without any minimum, a zero, a word and too many decimals are refused with field messages', async () => {
    const base = { partNumber: `TV-BAD-${suffix}`, name: 'Bad part', category: 'drive_unit' };
    expect((await run(savePartAction, base)).fieldErrors?.minWheelPower?.[0]).toMatch(/needs a minimum wheel power or torque/);
    expect((await run(savePartAction, { ...base, minWheelPower: '0' })).fieldErrors?.minWheelPower).toEqual(['Must be above zero.']);
    expect((await run(savePartAction, { ...base, minWheelPower: 'lots' })).fieldErrors?.minWheelPower?.[0]).toMatch(/Enter a number/);
    expect((await run(savePartAction, { ...base, category: 'battery', ratedCapacityAh: '17.456', nominalVoltageV: '36' })).fieldErrors?.ratedCapacityAh).toEqual(['At most two decimals.']);
    expect((await run(savePartAction, { ...base, minWheelPower: '0.04' })).fieldErrors?.minWheelPower?.[0]).toMatch(/Too small to store/);
    expect((await run(savePartAction, { ...base, minWheelPower: '300', unitCost: '12.345' })).message).toMatch(/3 decimals, but EUR has 2/);
    expect(await partRow(base.partNumber)).toBeUndefined();
  });

  it('a part number already in the catalog is refused on the field; the existing part is unchanged', async () => {
    const before = await partRow('TV-DU85');
    const r = await run(savePartAction, { partNumber: 'TV-DU85', name: 'Copy', category: 'drive_unit', minWheelPower: '100' });
    expect(r).toMatchObject({ ok: false, fieldErrors: { partNumber: ['Another part already has the number TV-DU85.'] } });
    expect(await partRow('TV-DU85')).toEqual(before);
  });

  it('another brand’s admin cannot edit this brand’s part: not found, and nothing changes', async () => {
    const part = await partRow('TV-DU60');
    await actAs(WRENFIELD_ADMIN);
    const r = await run(savePartAction, { id: part.id, partNumber: 'TV-DU60', name: 'Taken over', category: 'drive_unit', minWheelPower: '1' });
    expect(r).toMatchObject({ ok: false, message: 'No such part in your catalog.' });
    expect(await partRow('TV-DU60')).toEqual(part);
  });

  it('other roles and dealers are refused before anything is read (not found)', async () => {
    for (const email of ['priya.nair@torvane.test', 'hana.sato@torvane.test', 'lena.hartmann@kettenblatt.test', 'jonas.weber@kettenblatt.test']) {
      await actAs(email);
      await expect(run(savePartAction, { partNumber: `TV-X-${suffix}`, name: 'Sneaky', category: 'other' })).rejects.toThrow(/NEXT_HTTP_ERROR_FALLBACK;404/);
    }
    await actAs(null);
    await expect(run(savePartAction, { partNumber: `TV-X-${suffix}`, name: 'Sneaky', category: 'other' })).rejects.toThrow(/NEXT_REDIRECT/);
    expect(await partRow(`TV-X-${suffix}`)).toBeUndefined();
  });
});

describe('models', () => {
  beforeEach(() => actAs(TORVANE_ADMIN));

  it('takes a tyre size as ISO 5775 or a convertible inch size and stores the ISO designation', async () => {
    const code = `T-${suffix}`.slice(0, 20);
    // ISO 5775: 29 × 2.25 in sits on the 622 mm bead seat; 2.25 in = 57.15 mm → 57-622.
    expect(await run(saveModelAction, { code, name: 'Test Tourer', modelYear: '2026', legalClass: 'eu_pedelec', tyreSize: '29 x 2.25', active: 'on' })).toMatchObject({ ok: true });
    const row = await db()('bike_models').where({ brand_id: torvane, code }).first();
    expect(row).toMatchObject({ tyre_size: '57-622', legal_class: 'eu_pedelec', model_year: 2026 });
    expect((await run(saveModelAction, { code: `${code}b`.slice(0, 20), name: 'Bad tyre', legalClass: 'eu_pedelec', tyreSize: '584-100' })).fieldErrors?.tyreSize?.[0]).toMatch(/width first/);
    expect((await run(saveModelAction, { code, name: 'Dup', legalClass: 'us_class1', tyreSize: '50-584' })).fieldErrors).toEqual({ code: [`Another model already has the code ${code}.`] });
    expect((await run(saveModelAction, { code: 'Z', name: 'Z', legalClass: 'moped', tyreSize: '50-584' })).fieldErrors).toMatchObject({ legalClass: ['Choose the class the bike is sold as.'], name: ['Enter the model name.'] });
  });
});

describe('warranty policies', () => {
  let batteryBefore: Record<string, unknown>;
  beforeAll(async () => {
    batteryBefore = await db()('warranty_policies').where({ brand_id: torvane, category: 'battery' }).first();
  });
  afterAll(async () => {
    const { id: _id, ...rest } = batteryBefore;
    await db()('warranty_policies').where({ brand_id: torvane, category: 'battery' }).update(rest);
    await db()('warranty_policies').where({ brand_id: torvane, category: 'frame' }).delete();
  });
  beforeEach(() => actAs(TORVANE_ADMIN));

  it('edits the battery terms with exclusions from their checkboxes', async () => {
    const r = await run(savePolicyAction, {
      category: 'battery', coverageMonths: '30', cycleLimit: '900', capacityThresholdPct: '72.5', coreReturnDays: '20', coreGraceDays: '3',
      reviewDays: '4', appealDays: '21', exclusion_crash_damage: 'on', exclusion_improper_charging: 'on', exclusion_nonsense: 'on',
    });
    expect(r).toMatchObject({ ok: true });
    const row = await db()('warranty_policies').where({ brand_id: torvane, category: 'battery' }).first();
    expect(row).toMatchObject({ coverage_months: 30, cycle_limit: 900, core_return_days: 20, core_grace_days: 3, review_days: 4, appeal_days: 21, exclusions: ['crash_damage', 'improper_charging'] });
    expect(Number(row.capacity_threshold_pct)).toBe(72.5);
    // The other brand's battery policy is untouched.
    expect((await db()('warranty_policies').where({ brand_id: wrenfield, category: 'battery' }).first()).coverage_months).toBe(24);
  });

  it('a category without terms gets its first policy; battery-only terms on another category are refused', async () => {
    const bad = await run(savePolicyAction, { category: 'frame', coverageMonths: '60', cycleLimit: '100', coreReturnDays: '30', coreGraceDays: '5', reviewDays: '5', appealDays: '30' });
    expect(bad).toMatchObject({ ok: false, fieldErrors: { cycleLimit: ['Only a battery policy has this.'] } });
    expect(await db()('warranty_policies').where({ brand_id: torvane, category: 'frame' }).first()).toBeUndefined();
    expect(await run(savePolicyAction, { category: 'frame', coverageMonths: '60', coreReturnDays: '30', coreGraceDays: '5', reviewDays: '5', appealDays: '30' })).toMatchObject({ ok: true });
    expect(await db()('warranty_policies').where({ brand_id: torvane, category: 'frame' }).first()).toMatchObject({ coverage_months: 60, exclusions: [] });
  });

  it('refuses out-of-range terms, naming each field', async () => {
    const r = await run(savePolicyAction, { category: 'battery', coverageMonths: '0', capacityThresholdPct: '101', coreReturnDays: '', coreGraceDays: '-1', reviewDays: '2.5', appealDays: '30' });
    expect(r.fieldErrors).toMatchObject({
      coverageMonths: ['At least 1.'], capacityThresholdPct: ['At most 100 %.'], coreReturnDays: ['Enter the days to return the core.'],
      coreGraceDays: ['At least 0.'], reviewDays: ['Whole numbers only.'],
    });
  });
});

describe('labor times, prices, holidays and dealer rates', () => {
  beforeEach(() => actAs(TORVANE_ADMIN));

  it('standard hours are kept exactly as typed with two decimals; a comma, zero and over 40 h are refused', async () => {
    const code = `LT-${suffix}`.slice(0, 20);
    expect(await run(saveLaborAction, { code, description: 'Test operation', category: 'battery', standardHours: '1.25', active: 'on' })).toMatchObject({ ok: true });
    expect((await db()('labor_operations').where({ brand_id: torvane, code }).first()).standard_hours).toBe('1.25');
    for (const hours of ['1,25', '0', '41', '1.255']) {
      expect((await run(saveLaborAction, { code: `${code}x`, description: 'Bad', standardHours: hours })).fieldErrors?.standardHours).toHaveLength(1);
    }
  });

  it('adds a dated net price, exact in the brand’s currency; the same date twice and another brand’s part are refused', async () => {
    const part = await partRow('TV-CH4');
    const r = await run(addPriceAction, { partId: part.id, netPrice: '1,234.50', effectiveFrom: '2031-01-01' });
    expect(r).toMatchObject({ ok: true, message: 'TV-CH4: €1,234.50 from 2031-01-01.' });
    expect((await db()('price_list').where({ part_id: part.id, effective_from: '2031-01-01' }).first()).net_price_minor).toBe(123450);
    expect((await run(addPriceAction, { partId: part.id, netPrice: '99', effectiveFrom: '2031-01-01' })).fieldErrors?.effectiveFrom?.[0]).toMatch(/already has a price from 2031-01-01/);
    const foreign = await db()('parts').where({ brand_id: wrenfield }).first('id');
    expect(await run(addPriceAction, { partId: foreign.id, netPrice: '10', effectiveFrom: '2031-01-02' })).toMatchObject({ ok: false, fieldErrors: { partId: ['Choose a part of your catalog.'] } });
    expect(await db()('price_list').where({ part_id: foreign.id, effective_from: '2031-01-02' }).first()).toBeUndefined();
    expect((await run(addPriceAction, { partId: part.id, netPrice: '-5', effectiveFrom: '2031-01-03' })).fieldErrors?.netPrice).toEqual(['Must be above zero.']);
    await db()('price_list').where({ part_id: part.id, effective_from: '2031-01-01' }).delete();
  });

  it('adds and removes a holiday; a day twice is refused; another brand cannot remove it', async () => {
    const day = '2031-05-07';
    expect(await run(addHolidayAction, { day, name: 'Test closure' })).toMatchObject({ ok: true });
    expect((await run(addHolidayAction, { day, name: 'Again' })).fieldErrors).toEqual({ day: [`${day} is already in the calendar.`] });
    expect((await run(addHolidayAction, { day: '2031-02-30', name: 'No such day' })).fieldErrors?.day).toHaveLength(1);
    await actAs(WRENFIELD_ADMIN);
    expect(await run(removeHolidayAction, { day })).toMatchObject({ ok: false, message: 'That day is not in your calendar.' });
    await actAs(TORVANE_ADMIN);
    expect(await run(removeHolidayAction, { day })).toMatchObject({ ok: true });
    expect(await db()('brand_holidays').where({ brand_id: torvane, day }).first()).toBeUndefined();
  });

  it('sets a dealer’s agreed labor rate, noting the brand’s cap; another brand’s account is not found', async () => {
    const account = await db()('dealer_accounts').where({ brand_id: torvane }).first();
    const cap = (await db()('organisations').where({ id: torvane }).first('max_labor_rate_minor')).max_labor_rate_minor as number;
    try {
      const r = await run(laborRateAction, { accountId: account.id, laborRate: '85.00' });
      expect(r).toMatchObject({ ok: true });
      expect((await db()('dealer_accounts').where({ id: account.id }).first()).labor_rate_minor).toBe(8500);
      const over = await run(laborRateAction, { accountId: account.id, laborRate: ((cap + 100) / 100).toFixed(2) });
      expect(over.message).toMatch(/Credits pay at most €[\d.,]+ an hour, your cap/);
      await actAs(WRENFIELD_ADMIN);
      expect(await run(laborRateAction, { accountId: account.id, laborRate: '1.00' })).toMatchObject({ ok: false, message: 'No such dealer account.' });
      expect((await db()('dealer_accounts').where({ id: account.id }).first()).labor_rate_minor).toBe(cap + 100);
    } finally {
      await db()('dealer_accounts').where({ id: account.id }).update({ labor_rate_minor: account.labor_rate_minor });
    }
  });
});

describe('tenant scope', () => {
  it('nothing the other brand keeps changed while one brand edited its catalog', async () => {
    expect(otherBrandBefore.every((t) => t.length > 2)).toBe(true);
    expect(await otherBrandSnapshot()).toEqual(otherBrandBefore);
  });
});
