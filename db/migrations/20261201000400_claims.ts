import type { Knex } from 'knex';

export const ATTACHMENT_KINDS = [
  'photo', 'serial_label_photo', 'proof_of_purchase', 'diagnostic_log', 'load_test_before', 'load_test_after',
  'core_disposal_proof', 'inspection_photo',
] as const;

const appendOnly = (table: string) => `
  CREATE TRIGGER ${table}_no_update BEFORE UPDATE OR DELETE ON ${table}
    FOR EACH ROW EXECUTE FUNCTION refuse_change();
  CREATE TRIGGER ${table}_no_truncate BEFORE TRUNCATE ON ${table}
    FOR EACH STATEMENT EXECUTE FUNCTION refuse_change();`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE FUNCTION refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN RAISE EXCEPTION '% is append-only: rows are never changed or removed', TG_TABLE_NAME
      USING ERRCODE = 'insufficient_privilege'; END $$;`);

  // One sequence per brand, document kind and year, for claim, RMA and credit memo numbers.
  await knex.schema.createTable('document_sequences', (t) => {
    t.uuid('brand_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.text('kind').notNullable();
    t.integer('year').notNullable();
    t.integer('last_value').notNullable().defaultTo(0);
    t.primary(['brand_id', 'kind', 'year']);
  });

  await knex.schema.createTable('claims', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('number').notNullable();
    t.uuid('dealer_id').notNullable().references('id').inTable('organisations');
    t.uuid('brand_id').notNullable().references('id').inTable('organisations');
    t.uuid('dealer_account_id').notNullable().references('id').inTable('dealer_accounts');
    t.uuid('model_id').references('id').inTable('bike_models');
    t.uuid('registered_unit_id').references('id').inTable('registered_units');
    t.text('frame_serial').notNullable();
    t.uuid('part_id').references('id').inTable('parts');
    t.text('part_category');
    t.text('part_serial').notNullable().defaultTo('');
    t.date('sale_date');
    t.date('failure_date');
    t.decimal('odometer_km', 9, 1);
    t.integer('battery_cycles');
    t.text('symptom').notNullable().defaultTo('');
    t.text('error_codes').notNullable().defaultTo('');
    t.text('description').notNullable().defaultTo('');
    t.text('customer_name').notNullable().defaultTo('');
    t.text('customer_email').notNullable().defaultTo('');
    t.text('customer_phone').notNullable().defaultTo('');
    t.jsonb('requested_lines').notNullable().defaultTo(knex.raw(`'{"parts":[],"labor":[],"freightMinor":0}'::jsonb`));
    t.jsonb('approved_lines');
    t.jsonb('state_value').notNullable();
    t.jsonb('context').notNullable();
    t.integer('version').notNullable().defaultTo(0);
    t.text('rma_number');
    t.date('review_due_on');
    t.uuid('created_by').notNullable().references('id').inTable('users');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('submitted_at', { useTz: true });
    t.unique(['brand_id', 'number']);
    t.unique(['brand_id', 'rma_number']);
  });
  // Flat columns derived from the stored machine state, for filtering and indexing; the
  // database computes them so they can never disagree with the state itself.
  await knex.raw(`
    ALTER TABLE claims
      ADD COLUMN stage text GENERATED ALWAYS AS (
        CASE WHEN jsonb_typeof(state_value) = 'string' THEN state_value #>> '{}' ELSE 'approved' END) STORED,
      ADD COLUMN replacement_step text GENERATED ALWAYS AS (state_value #>> '{approved,replacement}') STORED,
      ADD COLUMN core_step text GENERATED ALWAYS AS (state_value #>> '{approved,core}') STORED,
      ADD COLUMN assigned_rep_id uuid GENERATED ALWAYS AS ((context ->> 'assignedRepId')::uuid) STORED`);
  await knex.raw(`ALTER TABLE claims ADD CONSTRAINT claims_odometer CHECK (odometer_km IS NULL OR odometer_km >= 0)`);
  await knex.raw(`ALTER TABLE claims ADD CONSTRAINT claims_cycles CHECK (battery_cycles IS NULL OR battery_cycles >= 0)`);
  await knex.raw(`ALTER TABLE claims ADD CONSTRAINT claims_sale_before_failure CHECK (sale_date IS NULL OR failure_date IS NULL OR sale_date <= failure_date)`);
  // The dealer claims list: one dealer, newest first, optionally one stage.
  await knex.raw(`CREATE INDEX claims_dealer_updated ON claims (dealer_id, updated_at DESC, id DESC)`);
  await knex.raw(`CREATE INDEX claims_dealer_stage_updated ON claims (dealer_id, stage, updated_at DESC, id DESC)`);
  // The brand review queue: one brand, by stage and deadline.
  await knex.raw(`CREATE INDEX claims_brand_stage_due ON claims (brand_id, stage, review_due_on, id)`);
  await knex.raw(`CREATE INDEX claims_brand_updated ON claims (brand_id, updated_at DESC, id DESC)`);
  await knex.raw(`CREATE INDEX claims_frame_serial ON claims (brand_id, lower(frame_serial))`);
  await knex.raw(`CREATE INDEX claims_part_serial ON claims (brand_id, lower(part_serial)) WHERE part_serial <> ''`);

  await knex.schema.createTable('claim_events', (t) => {
    t.bigIncrements('id');
    t.uuid('claim_id').notNullable().references('id').inTable('claims');
    t.uuid('actor_id').references('id').inTable('users');
    t.text('actor_role').notNullable();
    t.text('event').notNullable();
    t.jsonb('from_state');
    t.jsonb('to_state');
    t.jsonb('payload').notNullable().defaultTo('{}');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(`CREATE INDEX claim_events_claim ON claim_events (claim_id, id)`);
  await knex.raw(appendOnly('claim_events'));

  await knex.schema.createTable('attachments', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('claim_id').notNullable().references('id').inTable('claims');
    t.text('kind').notNullable();
    t.text('storage_key').notNullable().unique();
    t.text('thumbnail_key');
    t.text('file_name').notNullable();
    t.text('content_type').notNullable();
    t.bigInteger('size_bytes').notNullable();
    t.string('sha256', 64).notNullable();
    t.uuid('uploaded_by').notNullable().references('id').inTable('users');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(`ALTER TABLE attachments ADD CONSTRAINT attachments_kind CHECK (kind IN (${ATTACHMENT_KINDS.map((k) => `'${k}'`).join(', ')}))`);
  await knex.raw(`ALTER TABLE attachments ADD CONSTRAINT attachments_sha CHECK (sha256 ~ '^[0-9a-f]{64}$')`);
  await knex.raw(`CREATE INDEX attachments_claim ON attachments (claim_id, created_at)`);

  // A presigned upload the browser has been allowed to make, not yet verified.
  await knex.schema.createTable('upload_intents', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('claim_id').notNullable().references('id').inTable('claims').onDelete('CASCADE');
    t.text('kind').notNullable();
    t.text('storage_key').notNullable().unique();
    t.text('file_name').notNullable();
    t.text('declared_type').notNullable();
    t.bigInteger('declared_size').notNullable();
    t.string('declared_sha256', 64).notNullable();
    t.uuid('created_by').notNullable().references('id').inTable('users');
    t.timestamp('expires_at', { useTz: true }).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('upload_intents');
  await knex.schema.dropTableIfExists('attachments');
  await knex.schema.dropTableIfExists('claim_events');
  await knex.schema.dropTableIfExists('claims');
  await knex.schema.dropTableIfExists('document_sequences');
  await knex.raw('DROP FUNCTION IF EXISTS refuse_change()');
}
