import type { Knex } from 'knex';
import { seed as organisationsUsers } from './01_organisations_users';
import { seed as catalog } from './02_catalog';
import { seed as fulfilment } from './03_fulfilment';
import { seed as loadTests } from './20_load_tests';
import { seed as credits } from './30_credits';
import { seed as reviewDesk } from './90_review_desk';

// Sections run in order; each is idempotent on its natural keys, so a second start
// keeps what is there and adds only what a newer version of the scenario brings.
const sections: ((knex: Knex) => Promise<number>)[] = [organisationsUsers, catalog, fulfilment, loadTests, credits];
// These call the app's own services, which open their transactions themselves.
const serviceSections: ((knex: Knex) => Promise<number>)[] = [reviewDesk];

export async function loadDemo(knex: Knex): Promise<number> {
  let added = 0;
  for (const section of sections) added += await knex.transaction((trx) => section(trx));
  for (const section of serviceSections) added += await section(knex);
  return added;
}
