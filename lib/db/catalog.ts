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

// ——— Writes and admin views. Every statement names the brand, so an id of another brand's
// row matches nothing and the caller turns that into not-found.

export type ModelRow = Omit<BikeModel, 'id' | 'brandId'>;

const modelRow = (m: ModelRow) => ({ code: m.code, name: m.name, model_year: m.modelYear, legal_class: m.legalClass, tyre_size: m.tyreSize, active: m.active });

export async function insertModel(brandId: string, m: ModelRow, q: Knex = db()): Promise<string> {
  const [r] = await q('bike_models').insert({ brand_id: brandId, ...modelRow(m) }).returning('id');
  return r.id;
}

export async function updateModel(brandId: string, id: string, m: ModelRow, q: Knex = db()): Promise<boolean> {
  return (await q('bike_models').where({ brand_id: brandId, id }).update(modelRow(m))) === 1;
}

export type PartRow = Omit<Part, 'id' | 'brandId'>;

const partRow = (p: PartRow) => ({
  part_number: p.partNumber, name: p.name, category: p.category, min_wheel_power_w: p.minWheelPowerW,
  min_wheel_torque_nm: p.minWheelTorqueNm, rated_capacity_ah: p.ratedCapacityAh, nominal_voltage_v: p.nominalVoltageV,
  weight_kg: p.weightKg, unit_cost_minor: p.unitCostMinor, active: p.active,
});

export async function insertPart(brandId: string, p: PartRow, q: Knex = db()): Promise<string> {
  const [r] = await q('parts').insert({ brand_id: brandId, ...partRow(p) }).returning('id');
  return r.id;
}

export async function updatePart(brandId: string, id: string, p: PartRow, q: Knex = db()): Promise<boolean> {
  return (await q('parts').where({ brand_id: brandId, id }).update(partRow(p))) === 1;
}

export type PolicyRow = Omit<WarrantyPolicy, 'id' | 'brandId'>;

/** One policy per brand and category: saving a category's terms replaces the old ones. */
export async function upsertPolicy(brandId: string, p: PolicyRow, q: Knex = db()): Promise<void> {
  const row = {
    coverage_months: p.coverageMonths, cycle_limit: p.cycleLimit, capacity_threshold_pct: p.capacityThresholdPct,
    core_return_days: p.coreReturnDays, core_grace_days: p.coreGraceDays, review_days: p.reviewDays,
    appeal_days: p.appealDays, exclusions: p.exclusions,
  };
  await q('warranty_policies').insert({ brand_id: brandId, category: p.category, ...row }).onConflict(['brand_id', 'category']).merge(row);
}

export type LaborRow = Omit<LaborOperation, 'id' | 'brandId'>;

const laborRow = (l: LaborRow) => ({ code: l.code, description: l.description, category: l.category, standard_hours: l.standardHours, active: l.active });

export async function findLaborOperation(brandId: string, id: string, q: Knex = db()): Promise<LaborOperation | null> {
  return (await q('labor_operations').select(laborColumns).where({ brand_id: brandId, id }).first()) ?? null;
}

export async function insertLaborOperation(brandId: string, l: LaborRow, q: Knex = db()): Promise<string> {
  const [r] = await q('labor_operations').insert({ brand_id: brandId, ...laborRow(l) }).returning('id');
  return r.id;
}

export async function updateLaborOperation(brandId: string, id: string, l: LaborRow, q: Knex = db()): Promise<boolean> {
  return (await q('labor_operations').where({ brand_id: brandId, id }).update(laborRow(l))) === 1;
}

export type PriceHistoryRow = { id: string; partId: string; partNumber: string; partName: string; netPriceMinor: number; effectiveFrom: string };

export async function priceHistory(brandId: string, q: Knex = db()): Promise<PriceHistoryRow[]> {
  return q('price_list as l')
    .join('parts as p', 'p.id', 'l.part_id')
    .select('l.id', 'l.part_id as partId', 'p.part_number as partNumber', 'p.name as partName', 'l.net_price_minor as netPriceMinor', 'l.effective_from as effectiveFrom')
    .where('l.brand_id', brandId)
    .orderBy([{ column: 'p.part_number' }, { column: 'l.effective_from', order: 'desc' }]);
}

/** The composite foreign key (part_id, brand_id) refuses a part of another brand in the database too. */
export async function insertPrice(brandId: string, e: PriceEntry, q: Knex = db()): Promise<void> {
  await q('price_list').insert({ brand_id: brandId, part_id: e.partId, net_price_minor: e.netPriceMinor, effective_from: e.effectiveFrom });
}

export type Holiday = { day: string; name: string };

export async function listHolidays(brandId: string, q: Knex = db()): Promise<Holiday[]> {
  return q('brand_holidays').select('day', 'name').where({ brand_id: brandId }).orderBy('day');
}

export async function insertHoliday(brandId: string, h: Holiday, q: Knex = db()): Promise<void> {
  await q('brand_holidays').insert({ brand_id: brandId, day: h.day, name: h.name });
}

export async function deleteHoliday(brandId: string, day: string, q: Knex = db()): Promise<boolean> {
  return (await q('brand_holidays').where({ brand_id: brandId, day }).delete()) === 1;
}

export type CatalogCounts = { models: number; parts: number; policies: number; labor: number; prices: number; holidays: number; units: number; dealers: number };

export async function catalogCounts(brandId: string, q: Knex = db()): Promise<CatalogCounts> {
  const { rows } = await q.raw(
    `SELECT
       (SELECT count(*) FROM bike_models WHERE brand_id = :b) AS models,
       (SELECT count(*) FROM parts WHERE brand_id = :b) AS parts,
       (SELECT count(*) FROM warranty_policies WHERE brand_id = :b) AS policies,
       (SELECT count(*) FROM labor_operations WHERE brand_id = :b) AS labor,
       (SELECT count(*) FROM price_list WHERE brand_id = :b) AS prices,
       (SELECT count(*) FROM brand_holidays WHERE brand_id = :b) AS holidays,
       (SELECT count(*) FROM registered_units WHERE brand_id = :b) AS units,
       (SELECT count(*) FROM dealer_accounts WHERE brand_id = :b) AS dealers`,
    { b: brandId },
  );
  return Object.fromEntries(Object.entries(rows[0] as Record<string, string>).map(([k, v]) => [k, Number(v)])) as CatalogCounts;
}

// ——— The registry of sold units.

export type RegistryListRow = RegisteredUnit & { modelCode: string; sellingDealerName: string | null; createdAt: Date };

/** One page of the brand's registry, newest first; `q` finds a frame or component serial, a model or a shop. */
export async function searchRegisteredUnits(brandId: string, opts: { q?: string; page: number; pageSize: number }, q: Knex = db()): Promise<{ rows: RegistryListRow[]; total: number }> {
  const base = q('registered_units as u').join('bike_models as m', 'm.id', 'u.model_id').leftJoin('organisations as d', 'd.id', 'u.selling_dealer_id').where('u.brand_id', brandId);
  if (opts.q) {
    const like = `%${opts.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
    base.where((w) =>
      w
        .whereILike('u.frame_serial', like)
        .orWhereILike('m.code', like)
        .orWhereILike('m.name', like)
        .orWhereILike('d.name', like)
        .orWhereRaw('EXISTS (SELECT 1 FROM jsonb_each_text(u.component_serials) AS c(k, v) WHERE c.v ILIKE ?)', [like]),
    );
  }
  const [count, rows] = await Promise.all([
    base.clone().count<{ n: string }[]>('u.id as n').first(),
    base
      .clone()
      .select([...unitColumns, 'm.code as modelCode', 'd.name as sellingDealerName', 'u.created_at as createdAt'])
      .orderBy([{ column: 'u.created_at', order: 'desc' }, { column: 'u.frame_serial' }])
      .limit(opts.pageSize)
      .offset((opts.page - 1) * opts.pageSize),
  ]);
  return { rows, total: Number(count?.n ?? 0) };
}

/** Which of these serials (any case) the brand has registered already, upper-cased. */
export async function registeredSerialsAmong(brandId: string, serials: string[], q: Knex = db()): Promise<Set<string>> {
  const wanted = [...new Set(serials.map((s) => s.trim().toUpperCase()).filter(Boolean))];
  if (!wanted.length) return new Set();
  const rows = await q('registered_units').select(q.raw('upper(frame_serial) as s')).where({ brand_id: brandId }).whereRaw('upper(frame_serial) = ANY(?)', [wanted]);
  return new Set(rows.map((r: { s: string }) => r.s));
}

export type NewRegisteredUnit = { frameSerial: string; modelId: string; retailSaleDate: string; sellingDealerId: string | null; componentSerials: Record<string, string> };

export async function insertRegisteredUnits(trx: Knex, brandId: string, units: NewRegisteredUnit[]): Promise<number> {
  let n = 0;
  for (let i = 0; i < units.length; i += 1000) {
    const chunk = units.slice(i, i + 1000).map((u) => ({
      brand_id: brandId, frame_serial: u.frameSerial, model_id: u.modelId, retail_sale_date: u.retailSaleDate,
      selling_dealer_id: u.sellingDealerId, component_serials: JSON.stringify(u.componentSerials),
    }));
    n += (await trx('registered_units').insert(chunk).returning('id')).length;
  }
  return n;
}

export type RegistryImportLog = {
  id: number; importedByName: string; fileName: string; fileSha256: string | null; rowsTotal: number | null;
  rowsAdded: number; rowsSkipped: number; refusedRows: { row: number; frameSerial: string; problems: string[] }[]; createdAt: Date;
};

export async function insertRegistryImport(
  trx: Knex,
  r: { brandId: string; importedBy: string; fileName: string; fileSha256: string; rowsTotal: number; rowsAdded: number; refusedRows: RegistryImportLog['refusedRows'] },
): Promise<number> {
  const [row] = await trx('registry_imports')
    .insert({
      brand_id: r.brandId, imported_by: r.importedBy, file_name: r.fileName, file_sha256: r.fileSha256, rows_total: r.rowsTotal,
      rows_added: r.rowsAdded, rows_skipped: r.refusedRows.length, refused_rows: JSON.stringify(r.refusedRows),
    })
    .returning('id');
  return Number(row.id);
}

function importsQuery(q: Knex, brandId: string) {
  return q('registry_imports as i')
    .join('users as u', 'u.id', 'i.imported_by')
    .select('i.id', 'u.name as importedByName', 'i.file_name as fileName', 'i.file_sha256 as fileSha256', 'i.rows_total as rowsTotal',
      'i.rows_added as rowsAdded', 'i.rows_skipped as rowsSkipped', 'i.refused_rows as refusedRows', 'i.created_at as createdAt')
    .where('i.brand_id', brandId)
    .orderBy('i.created_at', 'desc');
}

export async function listRegistryImports(brandId: string, limit = 10, q: Knex = db()): Promise<RegistryImportLog[]> {
  return importsQuery(q, brandId).limit(limit);
}

/** The latest import of the same file by this brand, if any. */
export async function findImportOfFile(brandId: string, sha256: string, q: Knex = db()): Promise<RegistryImportLog | null> {
  return (await importsQuery(q, brandId).where('i.file_sha256', sha256).first()) ?? null;
}

export type BrandSettings = { id: string; name: string; currency: string; maxLaborRateMinor: number; timeZone: string };

export async function brandSettings(brandId: string, q: Knex = db()): Promise<BrandSettings | null> {
  return (
    (await q('organisations')
      .select('id', 'name', 'currency', 'max_labor_rate_minor as maxLaborRateMinor', 'time_zone as timeZone')
      .where({ id: brandId, kind: 'brand' })
      .first()) ?? null
  );
}

/** The brand's model codes, upper-cased → model id (registry import). */
export async function modelsByCode(brandId: string, q: Knex = db()): Promise<Map<string, string>> {
  const rows = await q('bike_models').select('code', 'id').where({ brand_id: brandId });
  return new Map(rows.map((r: { code: string; id: string }) => [r.code.toUpperCase(), r.id]));
}
