import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';

export type PartCategory = 'drive_unit' | 'battery' | 'controller' | 'display' | 'charger' | 'frame' | 'other';
export type LegalClass = 'eu_pedelec' | 'us_class1' | 'us_class2' | 'us_class3';

export type BikeModel = { id: string; brandId: string; code: string; name: string; modelYear: number | null; legalClass: LegalClass; tyreSize: string; active: boolean };
export type Part = {
  id: string; brandId: string; partNumber: string; name: string; category: PartCategory;
  minWheelPowerW: number | null; minWheelTorqueNm: number | null; ratedCapacityAh: number | null; nominalVoltageV: number | null;
  weightKg: number | null; unitCostMinor: number | null; active: boolean;
};
export type WarrantyPolicy = {
  id: string; brandId: string; category: PartCategory; coverageMonths: number; cycleLimit: number | null;
  capacityThresholdPct: number | null; coreReturnDays: number; coreGraceDays: number; reviewDays: number; appealDays: number; exclusions: string[];
};
export type LaborOperation = { id: string; brandId: string; code: string; description: string; category: PartCategory | null; standardHours: string; active: boolean };
export type PriceEntry = { partId: string; netPriceMinor: number; effectiveFrom: string };
export type RegisteredUnit = {
  id: string; brandId: string; frameSerial: string; modelId: string; modelName: string; legalClass: LegalClass; tyreSize: string;
  retailSaleDate: string; sellingDealerId: string | null; componentSerials: Record<string, string>;
};

const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));

const modelColumns = ['id', 'brand_id as brandId', 'code', 'name', 'model_year as modelYear', 'legal_class as legalClass', 'tyre_size as tyreSize', 'active'];

export async function listModels(brandId: string, q: Knex = db()): Promise<BikeModel[]> {
  return q('bike_models').select(modelColumns).where({ brand_id: brandId }).orderBy('name');
}

export async function findModel(brandId: string, id: string, q: Knex = db()): Promise<BikeModel | null> {
  return (await q('bike_models').select(modelColumns).where({ brand_id: brandId, id }).first()) ?? null;
}

const partColumns = [
  'id', 'brand_id as brandId', 'part_number as partNumber', 'name', 'category', 'min_wheel_power_w as minWheelPowerW',
  'min_wheel_torque_nm as minWheelTorqueNm', 'rated_capacity_ah as ratedCapacityAh', 'nominal_voltage_v as nominalVoltageV',
  'weight_kg as weightKg', 'unit_cost_minor as unitCostMinor', 'active',
];

function toPart(r: Record<string, unknown>): Part {
  return {
    ...(r as Part),
    minWheelPowerW: num(r.minWheelPowerW), minWheelTorqueNm: num(r.minWheelTorqueNm), ratedCapacityAh: num(r.ratedCapacityAh),
    nominalVoltageV: num(r.nominalVoltageV), weightKg: num(r.weightKg),
  };
}

export async function listParts(brandId: string, q: Knex = db()): Promise<Part[]> {
  return (await q('parts').select(partColumns).where({ brand_id: brandId }).orderBy('part_number')).map(toPart);
}

export async function findPart(brandId: string, id: string, q: Knex = db()): Promise<Part | null> {
  const r = await q('parts').select(partColumns).where({ brand_id: brandId, id }).first();
  return r ? toPart(r) : null;
}

const policyColumns = [
  'id', 'brand_id as brandId', 'category', 'coverage_months as coverageMonths', 'cycle_limit as cycleLimit',
  'capacity_threshold_pct as capacityThresholdPct', 'core_return_days as coreReturnDays', 'core_grace_days as coreGraceDays',
  'review_days as reviewDays', 'appeal_days as appealDays', 'exclusions',
];

function toPolicy(r: Record<string, unknown>): WarrantyPolicy {
  return { ...(r as WarrantyPolicy), capacityThresholdPct: num(r.capacityThresholdPct) };
}

export async function listPolicies(brandId: string, q: Knex = db()): Promise<WarrantyPolicy[]> {
  return (await q('warranty_policies').select(policyColumns).where({ brand_id: brandId }).orderBy('category')).map(toPolicy);
}

export async function findPolicy(brandId: string, category: PartCategory, q: Knex = db()): Promise<WarrantyPolicy | null> {
  const r = await q('warranty_policies').select(policyColumns).where({ brand_id: brandId, category }).first();
  return r ? toPolicy(r) : null;
}

const laborColumns = ['id', 'brand_id as brandId', 'code', 'description', 'category', 'standard_hours as standardHours', 'active'];

export async function listLaborOperations(brandId: string, q: Knex = db()): Promise<LaborOperation[]> {
  return q('labor_operations').select(laborColumns).where({ brand_id: brandId }).orderBy('code');
}

export async function currentPrices(brandId: string, onDate: string, q: Knex = db()): Promise<PriceEntry[]> {
  return q('price_list')
    .distinctOn('part_id')
    .select('part_id as partId', 'net_price_minor as netPriceMinor', 'effective_from as effectiveFrom')
    .where({ brand_id: brandId })
    .where('effective_from', '<=', onDate)
    .orderBy([{ column: 'part_id' }, { column: 'effective_from', order: 'desc' }]);
}

export async function brandHolidays(brandId: string, q: Knex = db()): Promise<string[]> {
  return (await q('brand_holidays').select('day').where({ brand_id: brandId }).orderBy('day')).map((r) => r.day as string);
}

const unitColumns = [
  'u.id', 'u.brand_id as brandId', 'u.frame_serial as frameSerial', 'u.model_id as modelId', 'm.name as modelName',
  'm.legal_class as legalClass', 'm.tyre_size as tyreSize', 'u.retail_sale_date as retailSaleDate',
  'u.selling_dealer_id as sellingDealerId', 'u.component_serials as componentSerials',
];

export async function findRegisteredUnit(brandId: string, frameSerial: string, q: Knex = db()): Promise<RegisteredUnit | null> {
  return (
    (await q('registered_units as u')
      .join('bike_models as m', 'm.id', 'u.model_id')
      .select(unitColumns)
      .where('u.brand_id', brandId)
      .whereRaw('upper(u.frame_serial) = upper(?)', [frameSerial.trim()])
      .first()) ?? null
  );
}

export async function listRegisteredUnits(brandId: string, limit = 200): Promise<RegisteredUnit[]> {
  return db()('registered_units as u')
    .join('bike_models as m', 'm.id', 'u.model_id')
    .select(unitColumns)
    .where('u.brand_id', brandId)
    .orderBy('u.created_at', 'desc')
    .limit(limit);
}
