import type { Knex } from 'knex';
import { demoHolidays, demoLabor, demoModels, demoParts, demoPolicies, demoUnits } from './demo-catalog';

const PRICE_LIST_DATE = '2026-01-01';

/** Idempotent on (brand, code / part number / category / day / frame serial). */
export async function seed(knex: Knex): Promise<number> {
  let added = 0;
  const orgId = async (slug: string) => (await knex('organisations').where({ slug }).first('id')).id as string;
  const count = (rows: unknown[]) => (added += rows.length);

  for (const brandSlug of Object.keys(demoModels)) {
    const brandId = await orgId(brandSlug);
    for (const m of demoModels[brandSlug]!) {
      count(await knex('bike_models').insert({ brand_id: brandId, code: m.code, name: m.name, model_year: m.year, legal_class: m.legalClass, tyre_size: m.tyre }).onConflict(['brand_id', 'code']).ignore().returning('id'));
    }
    for (const p of demoParts[brandSlug]!) {
      count(
        await knex('parts')
          .insert({
            brand_id: brandId, part_number: p.partNumber, name: p.name, category: p.category,
            min_wheel_power_w: p.minWheelPowerW ?? null, min_wheel_torque_nm: p.minWheelTorqueNm ?? null,
            rated_capacity_ah: p.ratedCapacityAh ?? null, nominal_voltage_v: p.nominalVoltageV ?? null,
            weight_kg: p.weightKg, unit_cost_minor: p.unitCostMinor,
          })
          .onConflict(['brand_id', 'part_number']).ignore().returning('id'),
      );
      const part = await knex('parts').where({ brand_id: brandId, part_number: p.partNumber }).first('id');
      count(await knex('price_list').insert({ brand_id: brandId, part_id: part.id, net_price_minor: p.netPriceMinor, effective_from: PRICE_LIST_DATE }).onConflict(['part_id', 'effective_from']).ignore().returning('id'));
    }
    for (const p of demoPolicies[brandSlug]!) {
      count(
        await knex('warranty_policies')
          .insert({
            brand_id: brandId, category: p.category, coverage_months: p.months, cycle_limit: p.cycles ?? null,
            capacity_threshold_pct: p.capacityPct ?? null, core_return_days: p.coreDays, review_days: p.reviewDays,
            appeal_days: p.appealDays, exclusions: p.exclusions,
          })
          .onConflict(['brand_id', 'category']).ignore().returning('id'),
      );
    }
    for (const l of demoLabor[brandSlug]!) {
      count(await knex('labor_operations').insert({ brand_id: brandId, code: l.code, description: l.description, category: l.category, standard_hours: l.hours }).onConflict(['brand_id', 'code']).ignore().returning('id'));
    }
    for (const [day, name] of demoHolidays[brandSlug]!) {
      count(await knex('brand_holidays').insert({ brand_id: brandId, day, name }).onConflict(['brand_id', 'day']).ignore().returning('day'));
    }
    for (const u of demoUnits[brandSlug]!) {
      const model = await knex('bike_models').where({ brand_id: brandId, code: u.model }).first('id');
      count(
        await knex('registered_units')
          .insert({ brand_id: brandId, frame_serial: u.frameSerial, model_id: model.id, retail_sale_date: u.sold, selling_dealer_id: await orgId(u.dealer), component_serials: JSON.stringify(u.components) })
          .onConflict(['brand_id', 'frame_serial']).ignore().returning('id'),
      );
    }
  }
  return added;
}
