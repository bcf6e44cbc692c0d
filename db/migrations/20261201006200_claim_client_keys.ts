import type { Knex } from 'knex';

// The new-claim form sends a key made once per form; a double click or a retried request with
// the same key finds the draft already made instead of making a second one.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('claims', (t) => t.text('client_key'));
  await knex.raw('CREATE UNIQUE INDEX claims_client_key ON claims (dealer_id, client_key) WHERE client_key IS NOT NULL');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX IF EXISTS claims_client_key');
  await knex.schema.alterTable('claims', (t) => t.dropColumn('client_key'));
}
