import type { Knex } from 'knex';

// The registry import log keeps which file was imported (its SHA-256) and why rows were left out,
// so an admin can see later what a file did and spot the same file offered twice.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('registry_imports', (t) => {
    t.string('file_sha256', 64);
    t.integer('rows_total');
    t.jsonb('refused_rows').notNullable().defaultTo('[]');
  });
  await knex.raw(`ALTER TABLE registry_imports ADD CONSTRAINT registry_imports_sha CHECK (file_sha256 IS NULL OR file_sha256 ~ '^[0-9a-f]{64}$')`);
  await knex.raw(`ALTER TABLE registry_imports ADD CONSTRAINT registry_imports_counts CHECK (rows_added > 0 AND rows_skipped >= 0)`);
  await knex.raw(`CREATE INDEX registry_imports_brand ON registry_imports (brand_id, created_at DESC)`);
  // A frame serial is one bike whatever its letter case; lookups (filing, import checks) use this too.
  await knex.raw(`CREATE UNIQUE INDEX registered_units_serial_upper ON registered_units (brand_id, upper(frame_serial))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX IF EXISTS registered_units_serial_upper');
  await knex.raw('DROP INDEX IF EXISTS registry_imports_brand');
  await knex.schema.alterTable('registry_imports', (t) => {
    t.dropChecks(['registry_imports_sha', 'registry_imports_counts']);
    t.dropColumns('file_sha256', 'rows_total', 'refused_rows');
  });
}
