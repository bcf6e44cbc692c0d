import type { Knex } from 'knex';

// The liability entry form sends a key made once per entry; a double click or a retried request
// with the same key records the entry once.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('liability_entries', (t) => {
    t.text('client_key');
    // NULLs never collide, so entries made without a key (the demo scenario, older rows) are unaffected.
    t.unique(['brand_id', 'client_key'], { indexName: 'liability_entries_client_key' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('liability_entries', (t) => {
    t.dropUnique(['brand_id', 'client_key'], 'liability_entries_client_key');
    t.dropColumn('client_key');
  });
}
