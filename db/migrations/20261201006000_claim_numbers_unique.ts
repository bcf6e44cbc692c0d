import type { Knex } from 'knex';

// Claim numbers become unique across the installation (they were per brand, so a shop filing
// with two brands could hold two claims with one number). Existing duplicates keep the number
// on their earliest claim; the others get fresh numbers, their memos follow, and each
// renumbering is logged on the claim's timeline.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('claim_number_sequences', (t) => {
    t.integer('year').primary();
    t.integer('last_value').notNullable();
  });
  await knex.raw(`
    INSERT INTO claim_number_sequences (year, last_value)
    SELECT substring(number from 4 for 4)::int, max(substring(number from 9 for 6)::int)
    FROM claims WHERE number ~ '^WC-[0-9]{4}-[0-9]{6}-[0-9]$'
    GROUP BY 1`);
  const dupes = await knex.raw(`
    SELECT id, number FROM (
      SELECT id, number, row_number() OVER (PARTITION BY number ORDER BY created_at, id) AS n FROM claims) d
    WHERE n > 1 ORDER BY number, id`);
  for (const d of dupes.rows as { id: string; number: string }[]) {
    const year = Number(d.number.slice(3, 7));
    const { rows } = await knex.raw(
      `INSERT INTO claim_number_sequences (year, last_value) VALUES (?, 1)
       ON CONFLICT (year) DO UPDATE SET last_value = claim_number_sequences.last_value + 1 RETURNING last_value`,
      [year],
    );
    const seq = String(rows[0].last_value).padStart(6, '0');
    const number = `WC-${year}-${seq}-${luhn(`${year}${seq}`)}`;
    await knex('claims').where({ id: d.id }).update({ number });
    // Memos carry the claim number they were issued under; statement matching reads it, so the
    // renumbered claim's memos follow (the one sanctioned change to those append-only rows).
    await knex.raw('ALTER TABLE credit_memos DISABLE TRIGGER credit_memos_no_update');
    await knex('credit_memos').where({ claim_id: d.id }).update({ claim_number: number });
    await knex.raw('ALTER TABLE credit_memos ENABLE TRIGGER credit_memos_no_update');
    const state = (await knex('claims').where({ id: d.id }).first('state_value')).state_value;
    await knex('claim_events').insert({
      claim_id: d.id, actor_id: null, actor_role: 'system', event: 'RENUMBERED',
      from_state: JSON.stringify(state), to_state: JSON.stringify(state), payload: JSON.stringify({ from: d.number, to: number }),
    });
  }
  await knex.raw('ALTER TABLE claims ADD CONSTRAINT claims_number_unique UNIQUE (number)');
  await knex('document_sequences').where({ kind: 'claim' }).delete();
}

// Frozen copy of the check digit of lib/credits (a migration must not change when the app does).
function luhn(digits: string): number {
  let sum = 0;
  for (let i = 0; i < digits.length; i++) {
    let d = Number(digits[digits.length - 1 - i]);
    if (i % 2 === 0) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
  }
  return (10 - (sum % 10)) % 10;
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE claims DROP CONSTRAINT IF EXISTS claims_number_unique');
  await knex.schema.dropTableIfExists('claim_number_sequences');
}
