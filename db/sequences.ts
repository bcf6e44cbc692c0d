import type { Knex } from 'knex';

// Document numbers (lib/credits/document-numbers.ts) take their sequence from here: claim
// numbers from one series for the whole installation — a shop files with several brands and
// must never see two claims with one number — RMAs and credit memos from each brand's own.
// Plain Knex without `server-only`, so the demo loader and tests use the same code.

export async function nextClaimSequence(knex: Knex, year: number): Promise<number> {
  const { rows } = await knex.raw(
    `INSERT INTO claim_number_sequences (year, last_value) VALUES (?, 1)
     ON CONFLICT (year) DO UPDATE SET last_value = claim_number_sequences.last_value + 1
     RETURNING last_value`,
    [year],
  );
  return rows[0].last_value;
}

export async function nextBrandSequence(knex: Knex, brandId: string, kind: 'rma' | 'credit_memo', year: number): Promise<number> {
  const { rows } = await knex.raw(
    `INSERT INTO document_sequences (brand_id, kind, year, last_value) VALUES (?, ?, ?, 1)
     ON CONFLICT (brand_id, kind, year) DO UPDATE SET last_value = document_sequences.last_value + 1
     RETURNING last_value`,
    [brandId, kind, year],
  );
  return rows[0].last_value;
}
