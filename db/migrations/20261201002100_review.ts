import type { Knex } from 'knex';

const OPEN_STAGES = `'submitted', 'in_review', 'waiting_on_dealer', 'appealed'`;

export async function up(knex: Knex): Promise<void> {
  // When the running review clock started: the submission, or the appeal that reopened it.
  await knex.schema.alterTable('claims', (t) => {
    t.timestamp('review_started_at', { useTz: true });
  });
  await knex.raw(`UPDATE claims SET review_started_at = submitted_at WHERE submitted_at IS NOT NULL`);
  await knex.raw(`ALTER TABLE claims ADD CONSTRAINT claims_review_started CHECK (review_started_at IS NULL OR submitted_at IS NOT NULL)`);

  // The review queue's open claims (what a rep works on), in deadline order. The columns the
  // queue filters on are carried in the index, so counting a filtered queue reads the index only.
  await knex.raw(`
    CREATE INDEX claims_review_open_due ON claims (brand_id, review_due_on, id)
      INCLUDE (stage, dealer_id, part_category, assigned_rep_id, submitted_at)
      WHERE stage IN (${OPEN_STAGES})`);
  // The same claims by age.
  await knex.raw(`CREATE INDEX claims_review_open_age ON claims (brand_id, submitted_at, id) WHERE stage IN (${OPEN_STAGES})`);

  // One reminder per claim, threshold and deadline: a moved deadline may be reminded again,
  // the same one never twice (the insert is the guard, so two workers cannot both send it).
  await knex.schema.createTable('review_deadline_alerts', (t) => {
    t.uuid('claim_id').notNullable().references('id').inTable('claims').onDelete('CASCADE');
    t.text('threshold').notNullable();
    t.date('due_on').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['claim_id', 'threshold', 'due_on']);
  });
  await knex.raw(`ALTER TABLE review_deadline_alerts ADD CONSTRAINT review_deadline_alerts_threshold CHECK (threshold IN ('due_soon', 'overdue'))`);

  // A message sent twice (a double click, a retried request) is one message.
  await knex.raw(`
    CREATE UNIQUE INDEX claim_events_message_key ON claim_events (claim_id, (payload->>'clientKey'))
    WHERE event = 'MESSAGE' AND payload->>'clientKey' IS NOT NULL`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX IF EXISTS claim_events_message_key');
  await knex.schema.dropTableIfExists('review_deadline_alerts');
  await knex.raw('DROP INDEX IF EXISTS claims_review_open_age');
  await knex.raw('DROP INDEX IF EXISTS claims_review_open_due');
  await knex.raw('ALTER TABLE claims DROP CONSTRAINT IF EXISTS claims_review_started');
  await knex.schema.alterTable('claims', (t) => {
    t.dropColumn('review_started_at');
  });
}
