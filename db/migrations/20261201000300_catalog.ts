import type { Knex } from 'knex';

const CATEGORIES = `('drive_unit', 'battery', 'controller', 'display', 'charger', 'frame', 'other')`;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('bike_models', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('brand_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.text('code').notNullable();
    t.text('name').notNullable();
    t.integer('model_year');
    // The legal class the bike is sold as; decides the speed limit a dyno run is checked against.
    t.text('legal_class').notNullable();
    t.text('tyre_size').notNullable();
    t.boolean('active').notNullable().defaultTo(true);
    t.unique(['brand_id', 'code']);
  });
  await knex.raw(`ALTER TABLE bike_models ADD CONSTRAINT bike_models_class CHECK (legal_class IN ('eu_pedelec', 'us_class1', 'us_class2', 'us_class3'))`);
  await knex.raw(`ALTER TABLE bike_models ADD CONSTRAINT bike_models_tyre CHECK (tyre_size ~ '^[0-9]{2,3}-[0-9]{3}$')`);

  await knex.schema.createTable('parts', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('brand_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.text('part_number').notNullable();
    t.text('name').notNullable();
    t.text('category').notNullable();
    // Load-test spec: drive parts on the dyno (at the wheel), batteries on a discharge.
    t.decimal('min_wheel_power_w', 8, 1);
    t.decimal('min_wheel_torque_nm', 8, 2);
    t.decimal('rated_capacity_ah', 8, 2);
    t.decimal('nominal_voltage_v', 6, 1);
    t.decimal('weight_kg', 7, 2);
    // What the part costs the brand: a shipped replacement settles the warranty at cost.
    t.bigInteger('unit_cost_minor');
    t.boolean('active').notNullable().defaultTo(true);
    t.unique(['brand_id', 'part_number']);
    t.unique(['id', 'brand_id']);
  });
  await knex.raw(`ALTER TABLE parts ADD CONSTRAINT parts_category CHECK (category IN ${CATEGORIES})`);
  await knex.raw(`ALTER TABLE parts ADD CONSTRAINT parts_battery_spec CHECK (
    category <> 'battery' OR (rated_capacity_ah > 0 AND nominal_voltage_v > 0))`);
  await knex.raw(`ALTER TABLE parts ADD CONSTRAINT parts_spec_positive CHECK (
    coalesce(min_wheel_power_w, 1) > 0 AND coalesce(min_wheel_torque_nm, 1) > 0)`);

  await knex.schema.createTable('warranty_policies', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('brand_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.text('category').notNullable();
    t.integer('coverage_months').notNullable();
    t.integer('cycle_limit');
    t.decimal('capacity_threshold_pct', 5, 2);
    t.integer('core_return_days').notNullable();
    t.integer('core_grace_days').notNullable().defaultTo(5);
    t.integer('review_days').notNullable();
    t.integer('appeal_days').notNullable().defaultTo(30);
    t.specificType('exclusions', 'text[]').notNullable().defaultTo('{}');
    t.unique(['brand_id', 'category']);
  });
  await knex.raw(`ALTER TABLE warranty_policies ADD CONSTRAINT warranty_policies_category CHECK (category IN ${CATEGORIES})`);
  await knex.raw(`ALTER TABLE warranty_policies ADD CONSTRAINT warranty_policies_positive CHECK (
    coverage_months > 0 AND core_return_days > 0 AND review_days > 0 AND appeal_days > 0 AND core_grace_days >= 0
    AND (cycle_limit IS NULL OR cycle_limit > 0)
    AND (capacity_threshold_pct IS NULL OR capacity_threshold_pct BETWEEN 1 AND 100))`);

  await knex.schema.createTable('labor_operations', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('brand_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.text('code').notNullable();
    t.text('description').notNullable();
    t.text('category');
    t.decimal('standard_hours', 5, 2).notNullable();
    t.boolean('active').notNullable().defaultTo(true);
    t.unique(['brand_id', 'code']);
  });
  await knex.raw(`ALTER TABLE labor_operations ADD CONSTRAINT labor_operations_hours CHECK (standard_hours > 0 AND standard_hours <= 40)`);

  await knex.schema.createTable('price_list', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('brand_id').notNullable();
    t.uuid('part_id').notNullable();
    t.bigInteger('net_price_minor').notNullable();
    t.date('effective_from').notNullable();
    t.foreign(['part_id', 'brand_id']).references(['id', 'brand_id']).inTable('parts').onDelete('CASCADE');
    t.unique(['part_id', 'effective_from']);
  });
  await knex.raw(`ALTER TABLE price_list ADD CONSTRAINT price_list_positive CHECK (net_price_minor > 0)`);

  await knex.schema.createTable('brand_holidays', (t) => {
    t.uuid('brand_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.date('day').notNullable();
    t.text('name').notNullable();
    t.primary(['brand_id', 'day']);
  });

  // Bikes the brand knows were sold: registration stands in for proof of purchase.
  await knex.schema.createTable('registered_units', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('brand_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.text('frame_serial').notNullable();
    t.uuid('model_id').notNullable().references('id').inTable('bike_models');
    t.date('retail_sale_date').notNullable();
    t.uuid('selling_dealer_id').references('id').inTable('organisations');
    t.jsonb('component_serials').notNullable().defaultTo('{}');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['brand_id', 'frame_serial']);
  });
  await knex.raw(`CREATE INDEX registered_units_component_serials ON registered_units USING gin (component_serials jsonb_path_ops)`);

  await knex.schema.createTable('registry_imports', (t) => {
    t.bigIncrements('id');
    t.uuid('brand_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.uuid('imported_by').notNullable().references('id').inTable('users');
    t.text('file_name').notNullable();
    t.integer('rows_added').notNullable();
    t.integer('rows_skipped').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const t of ['registry_imports', 'registered_units', 'brand_holidays', 'price_list', 'labor_operations', 'warranty_policies', 'parts', 'bike_models']) {
    await knex.schema.dropTableIfExists(t);
  }
}
