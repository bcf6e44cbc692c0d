import type { Knex } from 'knex';

// Credit memos and their lines are append-only: an issued memo is never edited or removed; a
// correction is a new memo that reverses it. The same holds for the accountant's draft edits,
// statement imports and lines, the match log and the liability entries. `refuse_change()` comes
// from the claims migration.
const appendOnly = (table: string) => `
  CREATE TRIGGER ${table}_no_update BEFORE UPDATE OR DELETE ON ${table}
    FOR EACH ROW EXECUTE FUNCTION refuse_change();
  CREATE TRIGGER ${table}_no_truncate BEFORE TRUNCATE ON ${table}
    FOR EACH STATEMENT EXECUTE FUNCTION refuse_change();`;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('credit_memos', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('brand_id').notNullable().references('id').inTable('organisations');
    t.uuid('dealer_id').notNullable().references('id').inTable('organisations');
    t.uuid('dealer_account_id').notNullable().references('id').inTable('dealer_accounts');
    t.uuid('claim_id').notNullable().references('id').inTable('claims');
    t.text('number').notNullable();
    t.text('kind').notNullable();
    // Copied at issue: a memo states the references it was issued under, whatever changes later.
    t.text('dealer_account_number').notNullable();
    t.text('claim_number').notNullable();
    t.text('rma_number');
    t.string('currency', 3).notNullable();
    t.bigInteger('total_minor').notNullable();
    t.date('issued_on').notNullable();
    t.timestamp('issued_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.uuid('issued_by').references('id').inTable('users');
    t.text('idempotency_key').notNullable().unique();
    t.text('draft_hash').notNullable();
    t.uuid('reverses_memo_id').references('id').inTable('credit_memos').unique();
    t.text('reason');
    t.unique(['brand_id', 'number']);
  });
  await knex.raw(`ALTER TABLE credit_memos ADD CONSTRAINT credit_memos_kind CHECK (kind IN ('claim', 'chargeback', 'reversal'))`);
  await knex.raw(`ALTER TABLE credit_memos ADD CONSTRAINT credit_memos_currency CHECK (currency ~ '^[A-Z]{3}$')`);
  await knex.raw(`ALTER TABLE credit_memos ADD CONSTRAINT credit_memos_number CHECK (number ~ '^CM-[0-9]{4}-[0-9]{6,}-[0-9]$')`);
  await knex.raw(`ALTER TABLE credit_memos ADD CONSTRAINT credit_memos_reversal CHECK (
    (kind = 'reversal') = (reverses_memo_id IS NOT NULL) AND (kind <> 'reversal' OR length(trim(coalesce(reason, ''))) > 0))`);
  await knex.raw(`CREATE INDEX credit_memos_brand_issued ON credit_memos (brand_id, issued_on DESC, number DESC)`);
  await knex.raw(`CREATE INDEX credit_memos_dealer_issued ON credit_memos (dealer_id, issued_on DESC)`);
  await knex.raw(`CREATE INDEX credit_memos_claim ON credit_memos (claim_id, issued_at)`);

  await knex.schema.createTable('credit_memo_lines', (t) => {
    t.uuid('memo_id').notNullable().references('id').inTable('credit_memos');
    t.integer('line_no').notNullable();
    t.text('kind').notNullable();
    t.text('status').notNullable();
    t.text('description').notNullable();
    t.text('part_number');
    t.text('category');
    t.text('labor_code');
    // Parts: a count; labor: approved hours.
    t.decimal('quantity', 12, 2);
    t.text('unit');
    t.bigInteger('unit_amount_minor');
    t.bigInteger('computed_minor').notNullable();
    t.bigInteger('amount_minor').notNullable();
    t.jsonb('basis').notNullable();
    t.jsonb('adjustments').notNullable().defaultTo('[]');
    t.integer('reverses_line_no');
    t.primary(['memo_id', 'line_no']);
  });
  await knex.raw(`ALTER TABLE credit_memo_lines ADD CONSTRAINT credit_memo_lines_kind CHECK (kind IN ('part', 'labor', 'freight', 'chargeback'))`);
  await knex.raw(`ALTER TABLE credit_memo_lines ADD CONSTRAINT credit_memo_lines_status CHECK (status IN ('credited', 'withheld', 'not_credited', 'charged_back'))`);
  await knex.raw(`ALTER TABLE credit_memo_lines ADD CONSTRAINT credit_memo_lines_unit CHECK (unit IS NULL OR unit IN ('each', 'hour'))`);
  // Withheld labor posts nothing; credits are not negative, chargebacks not positive; a reversal
  // line negates the line it reverses.
  await knex.raw(`ALTER TABLE credit_memo_lines ADD CONSTRAINT credit_memo_lines_sign CHECK (
    reverses_line_no IS NOT NULL
    OR (status = 'withheld' AND amount_minor = 0)
    OR (status IN ('credited', 'not_credited') AND amount_minor >= 0)
    OR (status = 'charged_back' AND amount_minor <= 0))`);

  // At commit, every memo written in the transaction must have lines and foot: total = Σ lines.
  // A line slipped into an old memo later makes it stop footing and is refused the same way.
  await knex.raw(`
    CREATE FUNCTION credit_memo_foots() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE memo uuid; lines bigint; total bigint; n integer; num text;
    BEGIN
      IF TG_TABLE_NAME = 'credit_memos' THEN memo := NEW.id; ELSE memo := NEW.memo_id; END IF;
      SELECT m.total_minor, m.number INTO total, num FROM credit_memos m WHERE m.id = memo;
      SELECT coalesce(sum(l.amount_minor), 0), count(*) INTO lines, n FROM credit_memo_lines l WHERE l.memo_id = memo;
      IF n = 0 THEN RAISE EXCEPTION 'credit memo % has no lines', num USING ERRCODE = 'check_violation'; END IF;
      IF lines <> total THEN
        RAISE EXCEPTION 'credit memo % total % is not the sum of its lines (%)', num, total, lines USING ERRCODE = 'check_violation';
      END IF;
      RETURN NULL;
    END $$;
    CREATE CONSTRAINT TRIGGER credit_memos_foot AFTER INSERT ON credit_memos
      DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION credit_memo_foots();
    CREATE CONSTRAINT TRIGGER credit_memo_lines_foot AFTER INSERT ON credit_memo_lines
      DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION credit_memo_foots();`);
  await knex.raw(appendOnly('credit_memos'));
  await knex.raw(appendOnly('credit_memo_lines'));

  // The accountant's edits of a claim's draft credit, each with its reason, replayed in order on
  // the computed draft. Kept after issue as the record of why a line posts what it posts.
  await knex.schema.createTable('credit_draft_edits', (t) => {
    t.bigIncrements('id');
    t.uuid('claim_id').notNullable().references('id').inTable('claims');
    t.integer('line_no').notNullable();
    t.text('line_kind').notNullable();
    t.bigInteger('amount_minor').notNullable();
    t.text('reason').notNullable();
    t.uuid('edited_by').notNullable().references('id').inTable('users');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['claim_id', 'id']);
  });
  await knex.raw(`ALTER TABLE credit_draft_edits ADD CONSTRAINT credit_draft_edits_reason CHECK (length(trim(reason)) > 0)`);
  await knex.raw(appendOnly('credit_draft_edits'));

  // Where statements come from (a dealer's books, the brand's accounting system), with the
  // column mapping last used for that source, so the next file of the same shape maps itself.
  await knex.schema.createTable('statement_sources', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('brand_id').notNullable().references('id').inTable('organisations');
    t.text('name').notNullable();
    t.uuid('dealer_id').references('id').inTable('organisations');
    t.jsonb('mapping').notNullable();
    t.jsonb('options').notNullable().defaultTo('{}');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(`CREATE UNIQUE INDEX statement_sources_name ON statement_sources (brand_id, lower(name))`);

  await knex.schema.createTable('statement_imports', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('brand_id').notNullable().references('id').inTable('organisations');
    t.uuid('source_id').notNullable().references('id').inTable('statement_sources');
    t.uuid('dealer_id').references('id').inTable('organisations');
    t.text('file_name').notNullable();
    t.string('sha256', 64).notNullable();
    t.string('currency', 3).notNullable();
    t.integer('date_window_days').notNullable();
    t.jsonb('mapping').notNullable();
    t.jsonb('options').notNullable();
    t.integer('line_count').notNullable();
    t.uuid('imported_by').notNullable().references('id').inTable('users');
    t.timestamp('imported_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    // The same file twice is a duplicate submit, not a second statement.
    t.unique(['brand_id', 'sha256']);
  });
  await knex.raw(`ALTER TABLE statement_imports ADD CONSTRAINT statement_imports_window CHECK (date_window_days BETWEEN 0 AND 90)`);
  await knex.raw(appendOnly('statement_imports'));

  await knex.schema.createTable('statement_lines', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('import_id').notNullable().references('id').inTable('statement_imports');
    t.integer('line_no').notNullable();
    t.text('reference');
    t.bigInteger('amount_minor').notNullable();
    t.date('line_date').notNullable();
    t.string('currency', 3).notNullable();
    t.uuid('dealer_id').references('id').inTable('organisations');
    // What matching found at import: proposed, ambiguous (with candidates) or unmatched (with why).
    t.jsonb('outcome').notNullable();
    t.unique(['import_id', 'line_no']);
  });
  await knex.raw(appendOnly('statement_lines'));

  await knex.schema.createTable('reconciliation_matches', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('brand_id').notNullable().references('id').inTable('organisations');
    t.uuid('statement_line_id').notNullable().references('id').inTable('statement_lines');
    t.uuid('memo_id').notNullable().references('id').inTable('credit_memos');
    t.text('basis').notNullable();
    t.text('reference_field');
    t.bigInteger('amount_difference_minor').notNullable();
    t.integer('days_apart').notNullable();
    t.text('status').notNullable().defaultTo('proposed');
    t.uuid('proposed_by').references('id').inTable('users');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.uuid('decided_by').references('id').inTable('users');
    t.timestamp('decided_at', { useTz: true });
    t.text('note');
  });
  await knex.raw(`ALTER TABLE reconciliation_matches ADD CONSTRAINT reconciliation_matches_basis CHECK (basis IN ('reference', 'amount_date', 'chosen'))`);
  await knex.raw(`ALTER TABLE reconciliation_matches ADD CONSTRAINT reconciliation_matches_status CHECK (status IN ('proposed', 'confirmed', 'rejected'))`);
  // One live match per statement line and per memo; confirmed stays confirmed.
  await knex.raw(`CREATE UNIQUE INDEX reconciliation_matches_line_live ON reconciliation_matches (statement_line_id) WHERE status IN ('proposed', 'confirmed')`);
  await knex.raw(`CREATE UNIQUE INDEX reconciliation_matches_memo_live ON reconciliation_matches (memo_id) WHERE status IN ('proposed', 'confirmed')`);
  await knex.raw(`CREATE INDEX reconciliation_matches_memo ON reconciliation_matches (memo_id, status)`);
  await knex.raw(`
    CREATE FUNCTION reconciliation_match_fits() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE l record; m record;
    BEGIN
      SELECT sl.currency, coalesce(sl.dealer_id, si.dealer_id) AS dealer_id, si.brand_id INTO l
        FROM statement_lines sl JOIN statement_imports si ON si.id = sl.import_id WHERE sl.id = NEW.statement_line_id;
      SELECT cm.currency, cm.dealer_id, cm.brand_id, cm.number INTO m FROM credit_memos cm WHERE cm.id = NEW.memo_id;
      IF l.brand_id <> NEW.brand_id OR m.brand_id <> NEW.brand_id THEN
        RAISE EXCEPTION 'a match joins a statement and a memo of the same brand' USING ERRCODE = 'check_violation';
      END IF;
      IF l.currency <> m.currency THEN
        RAISE EXCEPTION 'a statement line in % cannot match memo % in %', l.currency, m.number, m.currency USING ERRCODE = 'check_violation';
      END IF;
      IF l.dealer_id IS NOT NULL AND l.dealer_id <> m.dealer_id THEN
        RAISE EXCEPTION 'memo % belongs to another dealer than the statement line', m.number USING ERRCODE = 'check_violation';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER reconciliation_matches_fit BEFORE INSERT ON reconciliation_matches
      FOR EACH ROW EXECUTE FUNCTION reconciliation_match_fits();`);
  // A proposal is decided once (confirmed or rejected); what it joined never changes.
  await knex.raw(`
    CREATE FUNCTION reconciliation_match_decide() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN RAISE EXCEPTION 'matches are never removed; reject a proposal instead' USING ERRCODE = 'insufficient_privilege'; END IF;
      IF OLD.status <> 'proposed' THEN
        RAISE EXCEPTION 'this match was % already; a decided match is final', OLD.status USING ERRCODE = 'check_violation';
      END IF;
      IF NEW.status NOT IN ('confirmed', 'rejected') OR NEW.decided_at IS NULL
         OR (NEW.statement_line_id, NEW.memo_id, NEW.brand_id, NEW.basis, NEW.amount_difference_minor, NEW.days_apart, NEW.created_at)
            IS DISTINCT FROM (OLD.statement_line_id, OLD.memo_id, OLD.brand_id, OLD.basis, OLD.amount_difference_minor, OLD.days_apart, OLD.created_at) THEN
        RAISE EXCEPTION 'a proposal can only be confirmed or rejected' USING ERRCODE = 'check_violation';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER reconciliation_matches_decide BEFORE UPDATE OR DELETE ON reconciliation_matches
      FOR EACH ROW EXECUTE FUNCTION reconciliation_match_decide();`);

  // Every match and unmatch, in order: proposed (by the matcher or by hand), confirmed, rejected.
  await knex.schema.createTable('reconciliation_events', (t) => {
    t.bigIncrements('id');
    t.uuid('brand_id').notNullable().references('id').inTable('organisations');
    t.uuid('match_id').notNullable().references('id').inTable('reconciliation_matches');
    t.text('event').notNullable();
    t.uuid('actor_id').references('id').inTable('users');
    t.text('note');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['match_id', 'id']);
  });
  await knex.raw(`ALTER TABLE reconciliation_events ADD CONSTRAINT reconciliation_events_event CHECK (event IN ('proposed', 'confirmed', 'rejected'))`);
  await knex.raw(appendOnly('reconciliation_events'));

  // The accountant's entries for the warranty liability roll-forward (ASC 460-10-50-8(c)):
  // a starting balance, accruals for warranties issued, and changes in estimate. Settlements come
  // from issued memos (cash) and parts shipped at cost (in kind), not from here.
  await knex.schema.createTable('liability_entries', (t) => {
    t.bigIncrements('id');
    t.uuid('brand_id').notNullable().references('id').inTable('organisations');
    t.date('entry_date').notNullable();
    t.text('kind').notNullable();
    t.bigInteger('amount_minor').notNullable();
    t.string('currency', 3).notNullable();
    t.text('note').notNullable().defaultTo('');
    t.uuid('entered_by').notNullable().references('id').inTable('users');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['brand_id', 'entry_date']);
  });
  await knex.raw(`ALTER TABLE liability_entries ADD CONSTRAINT liability_entries_kind CHECK (kind IN ('opening_balance', 'accrual', 'change_in_estimate'))`);
  await knex.raw(`ALTER TABLE liability_entries ADD CONSTRAINT liability_entries_sign CHECK (kind <> 'accrual' OR amount_minor >= 0)`);
  await knex.raw(appendOnly('liability_entries'));
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('liability_entries');
  await knex.schema.dropTableIfExists('reconciliation_events');
  await knex.schema.dropTableIfExists('reconciliation_matches');
  await knex.raw('DROP FUNCTION IF EXISTS reconciliation_match_decide(); DROP FUNCTION IF EXISTS reconciliation_match_fits()');
  await knex.schema.dropTableIfExists('statement_lines');
  await knex.schema.dropTableIfExists('statement_imports');
  await knex.schema.dropTableIfExists('statement_sources');
  await knex.schema.dropTableIfExists('credit_draft_edits');
  await knex.schema.dropTableIfExists('credit_memo_lines');
  await knex.schema.dropTableIfExists('credit_memos');
  await knex.raw('DROP FUNCTION IF EXISTS credit_memo_foots()');
}
