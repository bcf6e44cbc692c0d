import type { Knex } from 'knex';

// The day a core is due back when nothing shipped (the shop fitted its own part): kept on the
// claim, as a delivered replacement's due day is kept on its parcel, for the returns queue.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('claims', (t) => t.date('core_due_on'));
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('claims', (t) => t.dropColumn('core_due_on'));
}
