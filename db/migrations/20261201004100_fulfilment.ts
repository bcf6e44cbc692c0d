import type { Knex } from 'knex';

const appendOnly = (table: string) => `
  CREATE TRIGGER ${table}_no_update BEFORE UPDATE OR DELETE ON ${table}
    FOR EACH ROW EXECUTE FUNCTION refuse_change();
  CREATE TRIGGER ${table}_no_truncate BEFORE TRUNCATE ON ${table}
    FOR EACH STATEMENT EXECUTE FUNCTION refuse_change();`;

const TRACKING = `('label_created', 'picked_up', 'in_transit', 'out_for_delivery', 'delivered', 'exception')`;

export async function up(knex: Knex): Promise<void> {
  // What the brand's warehouse holds of each part. Never below zero: the CHECK is the last word,
  // the guarded UPDATE in lib/db/stock.ts the first.
  await knex.schema.createTable('stock_levels', (t) => {
    t.uuid('part_id').primary();
    t.uuid('brand_id').notNullable();
    t.integer('on_hand').notNullable().defaultTo(0);
    t.date('restock_expected_on');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(['part_id', 'brand_id']).references(['id', 'brand_id']).inTable('parts').onDelete('CASCADE');
    t.index(['brand_id']);
  });
  await knex.raw(`ALTER TABLE stock_levels ADD CONSTRAINT stock_levels_not_negative CHECK (on_hand >= 0)`);

  // Every change of a stock level, append-only: shipments, adjustments with a reason, expected dates.
  await knex.schema.createTable('stock_movements', (t) => {
    t.bigIncrements('id');
    t.uuid('brand_id').notNullable();
    t.uuid('part_id').notNullable();
    t.text('kind').notNullable();
    t.integer('delta').notNullable();
    t.integer('on_hand_after').notNullable();
    t.text('reason').notNullable();
    t.text('note').notNullable().defaultTo('');
    t.date('expected_on');
    t.uuid('claim_id').references('id').inTable('claims');
    t.uuid('user_id').references('id').inTable('users');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(['part_id', 'brand_id']).references(['id', 'brand_id']).inTable('parts');
    t.index(['part_id', 'id']);
  });
  await knex.raw(`ALTER TABLE stock_movements ADD CONSTRAINT stock_movements_kind CHECK (kind IN ('shipment', 'adjustment', 'expected_date'))`);
  await knex.raw(`ALTER TABLE stock_movements ADD CONSTRAINT stock_movements_delta CHECK ((kind = 'expected_date') = (delta = 0) AND on_hand_after >= 0)`);
  await knex.raw(`ALTER TABLE stock_movements ADD CONSTRAINT stock_movements_shipment_claim CHECK (kind <> 'shipment' OR (claim_id IS NOT NULL AND delta < 0))`);
  await knex.raw(appendOnly('stock_movements'));

  // A parcel of a claim: the replacement going out, or the core coming back on a prepaid label.
  await knex.schema.createTable('shipments', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('claim_id').notNullable().references('id').inTable('claims');
    t.uuid('brand_id').notNullable().references('id').inTable('organisations');
    t.text('direction').notNullable();
    t.text('carrier').notNullable();
    t.text('service').notNullable();
    // How it travels in the lithium rules' terms: ground, air_cargo_aircraft, air_passenger_aircraft.
    t.text('transport').notNullable();
    t.text('tracking_number').notNullable();
    t.text('carrier_shipment_id');
    t.text('label_key');
    t.text('tracking_status').notNullable().defaultTo('label_created');
    t.jsonb('lines').notNullable().defaultTo('[]');
    // The lithium classification for each battery in the parcel (lib/shipping), as shown to the shipper.
    t.jsonb('dangerous_goods');
    t.text('battery_condition');
    t.uuid('packaging_confirmed_by').references('id').inTable('users');
    t.timestamp('packaging_confirmed_at', { useTz: true });
    t.timestamp('handed_over_at', { useTz: true });
    t.timestamp('delivered_at', { useTz: true });
    // Outbound only: the day the core is due back, from the delivery and the brand's calendar.
    t.date('core_due_on');
    t.timestamp('last_polled_at', { useTz: true });
    t.timestamp('voided_at', { useTz: true });
    t.uuid('created_by').references('id').inTable('users');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(`ALTER TABLE shipments ADD CONSTRAINT shipments_direction CHECK (direction IN ('outbound', 'return'))`);
  await knex.raw(`ALTER TABLE shipments ADD CONSTRAINT shipments_transport CHECK (transport IN ('ground', 'air_cargo_aircraft', 'air_passenger_aircraft'))`);
  await knex.raw(`ALTER TABLE shipments ADD CONSTRAINT shipments_tracking_status CHECK (tracking_status IN ${TRACKING})`);
  await knex.raw(`ALTER TABLE shipments ADD CONSTRAINT shipments_battery_condition CHECK (battery_condition IS NULL OR battery_condition IN ('sound', 'damaged_or_defective'))`);
  // A damaged or defective battery: special packaging confirmed, and never by air (49 CFR 173.185(f); IATA SP A154).
  await knex.raw(`ALTER TABLE shipments ADD CONSTRAINT shipments_damaged_battery CHECK (
    battery_condition IS DISTINCT FROM 'damaged_or_defective' OR (packaging_confirmed_at IS NOT NULL AND transport = 'ground'))`);
  // One live parcel per claim and direction: shipping twice cannot happen even if the code forgot to check.
  await knex.raw(`CREATE UNIQUE INDEX shipments_one_live_per_direction ON shipments (claim_id, direction) WHERE voided_at IS NULL`);
  await knex.raw(`CREATE UNIQUE INDEX shipments_tracking_unique ON shipments (carrier, tracking_number) WHERE voided_at IS NULL`);
  // The tracking poller: live parcels not yet delivered.
  await knex.raw(`CREATE INDEX shipments_to_poll ON shipments (last_polled_at NULLS FIRST) WHERE voided_at IS NULL AND delivered_at IS NULL`);

  await knex.schema.createTable('shipment_events', (t) => {
    t.bigIncrements('id');
    t.uuid('shipment_id').notNullable().references('id').inTable('shipments');
    t.text('status').notNullable();
    t.text('description').notNullable();
    t.text('location').notNullable().defaultTo('');
    t.timestamp('occurred_at', { useTz: true }).notNullable();
    t.timestamp('recorded_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['shipment_id', 'status', 'occurred_at']);
  });
  await knex.raw(`ALTER TABLE shipment_events ADD CONSTRAINT shipment_events_status CHECK (status IN ${TRACKING})`);
  await knex.raw(appendOnly('shipment_events'));
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('shipment_events');
  await knex.schema.dropTableIfExists('shipments');
  await knex.schema.dropTableIfExists('stock_movements');
  await knex.schema.dropTableIfExists('stock_levels');
}
