import type { Knex } from 'knex';

// The dealer claims table also sorts by claim number and by failure date; without these, a
// page of 50 sorted that way sorts all of the dealer's claims first (EXPLAIN in
// tests/bench/claims-list.ts). The failure date is the one nullable sort key: undated drafts
// come last newest-first, and the backward scan gives the exact reverse.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`CREATE INDEX claims_dealer_number ON claims (dealer_id, number, id)`);
  await knex.raw(`CREATE INDEX claims_dealer_failure ON claims (dealer_id, failure_date DESC NULLS LAST, id DESC)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX IF EXISTS claims_dealer_failure');
  await knex.raw('DROP INDEX IF EXISTS claims_dealer_number');
}
