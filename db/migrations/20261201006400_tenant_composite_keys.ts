import type { Knex } from 'knex';

// Rows that belong to one brand or one dealer can only point at rows of the same brand or dealer,
// whatever the code does: a claim's part, bike model, registered bike and dealer account are the
// claim's brand's (and the account the claim's dealer's); a dealer account is in its brand's
// currency; a memo or a parcel belongs to its claim's brand (and a memo to its dealer and account);
// stock and prices are kept for the brand's own parts.
const UNIQUE: [table: string, name: string, columns: string][] = [
  ['parts', 'parts_id_brand', 'id, brand_id'],
  ['bike_models', 'bike_models_id_brand', 'id, brand_id'],
  ['registered_units', 'registered_units_id_brand', 'id, brand_id'],
  ['dealer_accounts', 'dealer_accounts_id_parties', 'id, dealer_id, brand_id'],
  ['organisations', 'organisations_id_currency', 'id, currency'],
  ['claims', 'claims_id_parties', 'id, brand_id, dealer_id'],
  ['claims', 'claims_id_brand', 'id, brand_id'],
];

const FOREIGN: [table: string, name: string, columns: string, references: string][] = [
  ['claims', 'claims_part_of_brand', 'part_id, brand_id', 'parts (id, brand_id)'],
  ['claims', 'claims_model_of_brand', 'model_id, brand_id', 'bike_models (id, brand_id)'],
  ['claims', 'claims_unit_of_brand', 'registered_unit_id, brand_id', 'registered_units (id, brand_id)'],
  ['claims', 'claims_account_of_parties', 'dealer_account_id, dealer_id, brand_id', 'dealer_accounts (id, dealer_id, brand_id)'],
  ['dealer_accounts', 'dealer_accounts_brand_currency', 'brand_id, currency', 'organisations (id, currency)'],
  ['credit_memos', 'credit_memos_claim_parties', 'claim_id, brand_id, dealer_id', 'claims (id, brand_id, dealer_id)'],
  ['credit_memos', 'credit_memos_account_of_parties', 'dealer_account_id, dealer_id, brand_id', 'dealer_accounts (id, dealer_id, brand_id)'],
  ['shipments', 'shipments_claim_brand', 'claim_id, brand_id', 'claims (id, brand_id)'],
  ['stock_levels', 'stock_levels_part_of_brand', 'part_id, brand_id', 'parts (id, brand_id)'],
  ['price_list', 'price_list_part_of_brand', 'part_id, brand_id', 'parts (id, brand_id)'],
];

export async function up(knex: Knex): Promise<void> {
  for (const [table, name, columns] of UNIQUE) await knex.raw(`ALTER TABLE ${table} ADD CONSTRAINT ${name} UNIQUE (${columns})`);
  for (const [table, name, columns, references] of FOREIGN) {
    await knex.raw(`ALTER TABLE ${table} ADD CONSTRAINT ${name} FOREIGN KEY (${columns}) REFERENCES ${references}`);
  }
}

export async function down(knex: Knex): Promise<void> {
  for (const [table, name] of [...FOREIGN].reverse()) await knex.raw(`ALTER TABLE ${table} DROP CONSTRAINT IF EXISTS ${name}`);
  for (const [table, name] of [...UNIQUE].reverse()) await knex.raw(`ALTER TABLE ${table} DROP CONSTRAINT IF EXISTS ${name}`);
}
