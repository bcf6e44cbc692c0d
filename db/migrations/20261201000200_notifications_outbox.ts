import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // What a user sees under "Updates"; one row per recipient.
  await knex.schema.createTable('notifications', (t) => {
    t.bigIncrements('id');
    t.uuid('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.uuid('claim_id');
    t.text('kind').notNullable();
    t.text('title').notNullable();
    t.text('body').notNullable();
    t.text('link');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('read_at', { useTz: true });
    t.index(['user_id', 'created_at']);
  });
  await knex.raw(`CREATE INDEX notifications_unread ON notifications (user_id) WHERE read_at IS NULL`);

  // Mail written in the same transaction as the step that causes it, sent afterwards by
  // the worker. message_id is fixed at insert, so a retry can never become a second mail.
  await knex.schema.createTable('outbox', (t) => {
    t.bigIncrements('id');
    t.text('message_id').notNullable().unique();
    t.text('to_email').notNullable();
    t.text('subject').notNullable();
    t.text('text_body').notNullable();
    t.text('html_body');
    t.bigInteger('notification_id').references('id').inTable('notifications').onDelete('SET NULL');
    t.uuid('claim_id');
    t.text('status').notNullable().defaultTo('pending');
    t.integer('attempts').notNullable().defaultTo(0);
    t.timestamp('next_attempt_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('locked_until', { useTz: true });
    t.text('last_error');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('sent_at', { useTz: true });
  });
  await knex.raw(`ALTER TABLE outbox ADD CONSTRAINT outbox_status_check CHECK (status IN ('pending', 'sent'))`);
  await knex.raw(`CREATE INDEX outbox_due ON outbox (next_attempt_at, id) WHERE status = 'pending'`);
  // Wake the worker at once instead of waiting for its next poll.
  await knex.raw(`
    CREATE FUNCTION outbox_notify() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN PERFORM pg_notify('outbox', NEW.id::text); RETURN NEW; END $$;
    CREATE TRIGGER outbox_notify AFTER INSERT ON outbox FOR EACH ROW EXECUTE FUNCTION outbox_notify();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS outbox_notify ON outbox; DROP FUNCTION IF EXISTS outbox_notify()');
  await knex.schema.dropTableIfExists('outbox');
  await knex.schema.dropTableIfExists('notifications');
}
