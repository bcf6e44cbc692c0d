import type { Knex } from 'knex';

// The role a user may hold depends on the kind of organisation: the database enforces it
// through a composite foreign key (organisation id + kind) and a CHECK on the pair.
export const ROLE_FITS_KIND = `(
  (org_kind = 'dealer' AND role IN ('dealer', 'dealer_admin')) OR
  (org_kind = 'brand' AND role IN ('brand_rep', 'warehouse', 'accountant', 'brand_admin'))
)`;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('organisations', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('kind').notNullable();
    t.text('name').notNullable();
    t.text('slug').notNullable().unique();
    t.string('country', 2).notNullable();
    t.text('time_zone').notNullable().defaultTo('UTC');
    t.text('address_line').notNullable().defaultTo('');
    t.text('city').notNullable().defaultTo('');
    t.text('postcode').notNullable().defaultTo('');
    t.text('contact_email');
    // Brand-only settings: one currency per brand, and the cap on a dealer's labor rate.
    t.string('currency', 3);
    t.bigInteger('max_labor_rate_minor');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['id', 'kind']);
  });
  await knex.raw(`ALTER TABLE organisations ADD CONSTRAINT organisations_kind_check CHECK (kind IN ('dealer', 'brand'))`);
  await knex.raw(`ALTER TABLE organisations ADD CONSTRAINT organisations_brand_money CHECK (
    kind = 'dealer' OR (currency ~ '^[A-Z]{3}$' AND max_labor_rate_minor > 0))`);

  await knex.schema.createTable('users', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('organisation_id').notNullable();
    t.text('org_kind').notNullable();
    t.text('email').notNullable();
    t.text('name').notNullable();
    t.text('password_hash');
    t.text('role').notNullable();
    t.text('units').notNullable().defaultTo('metric');
    t.text('time_zone').notNullable().defaultTo('UTC');
    t.timestamp('disabled_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(['organisation_id', 'org_kind']).references(['id', 'kind']).inTable('organisations').onDelete('CASCADE');
    t.index(['organisation_id']);
  });
  await knex.raw(`CREATE UNIQUE INDEX users_email_lower_unique ON users (lower(email))`);
  await knex.raw(`ALTER TABLE users ADD CONSTRAINT users_role_fits_org CHECK ${ROLE_FITS_KIND}`);
  await knex.raw(`ALTER TABLE users ADD CONSTRAINT users_units_check CHECK (units IN ('metric', 'imperial'))`);

  await knex.schema.createTable('invitations', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('organisation_id').notNullable();
    t.text('org_kind').notNullable();
    t.text('email').notNullable();
    t.text('name').notNullable();
    t.text('role').notNullable();
    t.text('token_hash').notNullable().unique();
    t.uuid('invited_by').notNullable().references('id').inTable('users');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('accepted_at', { useTz: true });
    t.uuid('accepted_user_id').references('id').inTable('users');
    t.foreign(['organisation_id', 'org_kind']).references(['id', 'kind']).inTable('organisations').onDelete('CASCADE');
  });
  await knex.raw(`ALTER TABLE invitations ADD CONSTRAINT invitations_role_fits_org CHECK ${ROLE_FITS_KIND}`);

  await knex.schema.createTable('signin_throttle', (t) => {
    t.text('email').primary();
    t.integer('failures').notNullable().defaultTo(0);
    t.timestamp('window_started_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('locked_until', { useTz: true });
  });

  await knex.schema.createTable('dealer_accounts', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('dealer_id').notNullable();
    t.text('dealer_kind').notNullable().defaultTo('dealer');
    t.uuid('brand_id').notNullable();
    t.text('brand_kind').notNullable().defaultTo('brand');
    t.text('account_number').notNullable();
    t.bigInteger('labor_rate_minor').notNullable();
    t.string('currency', 3).notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.foreign(['dealer_id', 'dealer_kind']).references(['id', 'kind']).inTable('organisations').onDelete('CASCADE');
    t.foreign(['brand_id', 'brand_kind']).references(['id', 'kind']).inTable('organisations').onDelete('CASCADE');
    t.unique(['dealer_id', 'brand_id']);
    t.unique(['brand_id', 'account_number']);
  });
  await knex.raw(`ALTER TABLE dealer_accounts ADD CONSTRAINT dealer_accounts_kinds CHECK (dealer_kind = 'dealer' AND brand_kind = 'brand')`);
  await knex.raw(`ALTER TABLE dealer_accounts ADD CONSTRAINT dealer_accounts_rate CHECK (labor_rate_minor > 0)`);
  await knex.raw(`ALTER TABLE dealer_accounts ADD CONSTRAINT dealer_accounts_currency CHECK (currency ~ '^[A-Z]{3}$')`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('dealer_accounts');
  await knex.schema.dropTableIfExists('signin_throttle');
  await knex.schema.dropTableIfExists('invitations');
  await knex.schema.dropTableIfExists('users');
  await knex.schema.dropTableIfExists('organisations');
}
