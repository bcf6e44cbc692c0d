import type { Knex } from 'knex';

/**
 * Load-test runs analysed on the server, one per uploaded load-test file, and the column
 * mappings each dealer confirmed for files whose headers were not our own.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('load_test_runs', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('claim_id').notNullable().references('id').inTable('claims');
    // Removing a wrong file from a draft removes its analysis with it.
    t.uuid('attachment_id').notNullable().unique().references('id').inTable('attachments').onDelete('CASCADE');
    t.text('phase').notNullable();
    t.text('kind').notNullable();
    t.text('header_signature').notNullable();
    // Header as written in the file → { quantity, unit }: what the analysis read each column as.
    t.jsonb('column_mapping').notNullable();
    t.text('mapping_source').notNullable();
    // SI values: pressures Pa, load kg, temperature °C, circumference mm, state of charge %.
    t.jsonb('conditions').notNullable();
    // Figures, speed-binned curve and checks; never the raw samples.
    t.jsonb('summary').notNullable();
    // How the file was read (line numbers of reordered or dropped samples, sign turned round…).
    t.jsonb('warnings').notNullable().defaultTo('[]');
    // The part's spec (or the brand's capacity threshold) as it stood when the run was analysed.
    t.jsonb('spec').notNullable();
    // Meets every minimum the spec sets; for an after-test this is what the verified gate reads.
    t.boolean('meets_spec').notNullable();
    t.integer('sample_count').notNullable();
    t.uuid('created_by').notNullable().references('id').inTable('users');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(`ALTER TABLE load_test_runs ADD CONSTRAINT load_test_runs_phase CHECK (phase IN ('before', 'after'))`);
  await knex.raw(`ALTER TABLE load_test_runs ADD CONSTRAINT load_test_runs_kind CHECK (kind IN ('dyno', 'battery'))`);
  await knex.raw(`ALTER TABLE load_test_runs ADD CONSTRAINT load_test_runs_mapping_source CHECK (mapping_source IN ('recognised', 'saved', 'entered'))`);
  await knex.raw(`ALTER TABLE load_test_runs ADD CONSTRAINT load_test_runs_samples CHECK (sample_count >= 2)`);
  await knex.raw(`CREATE INDEX load_test_runs_claim ON load_test_runs (claim_id, phase, created_at)`);
  // The run must describe a load-test file of its own claim and phase.
  await knex.raw(`
    CREATE FUNCTION load_test_run_fits_attachment() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE a record;
    BEGIN
      SELECT claim_id, kind INTO a FROM attachments WHERE id = NEW.attachment_id;
      IF a.claim_id IS DISTINCT FROM NEW.claim_id OR a.kind IS DISTINCT FROM 'load_test_' || NEW.phase THEN
        RAISE EXCEPTION 'load test run % does not match its attachment (claim %, kind %)', NEW.id, a.claim_id, a.kind
          USING ERRCODE = 'check_violation';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER load_test_runs_fit BEFORE INSERT OR UPDATE ON load_test_runs
      FOR EACH ROW EXECUTE FUNCTION load_test_run_fits_attachment();`);

  await knex.schema.createTable('load_test_mappings', (t) => {
    t.uuid('dealer_id').notNullable().references('id').inTable('organisations').onDelete('CASCADE');
    t.text('kind').notNullable();
    t.text('header_signature').notNullable();
    t.jsonb('headers').notNullable();
    t.jsonb('mapping').notNullable();
    t.uuid('updated_by').notNullable().references('id').inTable('users');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['dealer_id', 'kind', 'header_signature']);
  });
  await knex.raw(`ALTER TABLE load_test_mappings ADD CONSTRAINT load_test_mappings_kind CHECK (kind IN ('dyno', 'battery'))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('load_test_mappings');
  await knex.schema.dropTableIfExists('load_test_runs');
  await knex.raw('DROP FUNCTION IF EXISTS load_test_run_fits_attachment()');
}
