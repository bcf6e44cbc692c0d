import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import type { HeaderMapping } from '@/lib/reconciliation/suggest-mapping';
import type { MemoForMatching } from '@/lib/reconciliation';
import type { CurrencyCode } from '@/lib/money';

export type StatementOptions = {
  dateFormat: 'YYYY-MM-DD' | 'DD.MM.YYYY' | 'DD/MM/YYYY' | 'MM/DD/YYYY';
  decimalSeparator: '.' | ',';
  negate: boolean;
  dateWindowDays: number;
};

export type StatementSource = { id: string; name: string; dealerId: string | null; mapping: HeaderMapping; options: Partial<StatementOptions> };

export async function listSources(brandId: string): Promise<StatementSource[]> {
  return db()('statement_sources').select('id', 'name', 'dealer_id as dealerId', 'mapping', 'options').where({ brand_id: brandId }).orderBy('name');
}

/** The mapping is remembered per source: the last one used wins. */
export async function saveSource(
  trx: Knex,
  s: { brandId: string; name: string; dealerId: string | null; mapping: HeaderMapping; options: StatementOptions },
): Promise<string> {
  const existing = await trx('statement_sources').where({ brand_id: s.brandId }).whereRaw('lower(name) = lower(?)', [s.name]).forUpdate().first('id');
  if (existing) {
    await trx('statement_sources')
      .where({ id: existing.id })
      .update({ dealer_id: s.dealerId, mapping: JSON.stringify(s.mapping), options: JSON.stringify(s.options), updated_at: trx.fn.now() });
    return existing.id;
  }
  const [row] = await trx('statement_sources')
    .insert({ brand_id: s.brandId, name: s.name, dealer_id: s.dealerId, mapping: JSON.stringify(s.mapping), options: JSON.stringify(s.options) })
    .returning('id');
  return row.id;
}

export type ImportRow = {
  id: string;
  sourceName: string;
  dealerId: string | null;
  dealerName: string | null;
  fileName: string;
  currency: CurrencyCode;
  dateWindowDays: number;
  lineCount: number;
  importedByName: string;
  importedAt: string;
  confirmed: number;
  proposed: number;
};

function importBase(q: Knex) {
  return q('statement_imports as i')
    .join('statement_sources as s', 's.id', 'i.source_id')
    .join('users as u', 'u.id', 'i.imported_by')
    .leftJoin('organisations as d', 'd.id', 'i.dealer_id')
    .select(
      'i.id', 's.name as sourceName', 'i.dealer_id as dealerId', 'd.name as dealerName', 'i.file_name as fileName', 'i.currency',
      'i.date_window_days as dateWindowDays', 'i.line_count as lineCount', 'u.name as importedByName', 'i.imported_at as importedAt',
      q.raw(`(SELECT count(*)::int FROM reconciliation_matches x JOIN statement_lines l ON l.id = x.statement_line_id WHERE l.import_id = i.id AND x.status = 'confirmed') as confirmed`),
      q.raw(`(SELECT count(*)::int FROM reconciliation_matches x JOIN statement_lines l ON l.id = x.statement_line_id WHERE l.import_id = i.id AND x.status = 'proposed') as proposed`),
    );
}

const toImport = (r: Record<string, unknown>): ImportRow => ({ ...(r as ImportRow), importedAt: new Date(r.importedAt as string).toISOString() });

export async function listImports(brandId: string, limit = 100): Promise<ImportRow[]> {
  return (await importBase(db()).where('i.brand_id', brandId).orderBy('i.imported_at', 'desc').limit(limit)).map(toImport);
}

export async function findImport(brandId: string, id: string, q: Knex = db()): Promise<ImportRow | null> {
  const r = await importBase(q).where({ 'i.brand_id': brandId, 'i.id': id }).first();
  return r ? toImport(r) : null;
}

export async function findImportBySha(brandId: string, sha256: string, q: Knex = db()): Promise<ImportRow | null> {
  const r = await importBase(q).where({ 'i.brand_id': brandId, 'i.sha256': sha256 }).first();
  return r ? toImport(r) : null;
}

/** Statement imports of one brand run one at a time, so two cannot propose the same memo. */
export async function lockBrandStatements(trx: Knex, brandId: string): Promise<void> {
  await trx.raw(`SELECT pg_advisory_xact_lock(hashtext('statements:' || ?))`, [brandId]);
}

export async function insertImport(
  trx: Knex,
  i: { brandId: string; sourceId: string; dealerId: string | null; fileName: string; sha256: string; currency: string; dateWindowDays: number; mapping: HeaderMapping; options: StatementOptions; lineCount: number; by: string },
): Promise<string> {
  const [row] = await trx('statement_imports')
    .insert({
      brand_id: i.brandId, source_id: i.sourceId, dealer_id: i.dealerId, file_name: i.fileName, sha256: i.sha256, currency: i.currency,
      date_window_days: i.dateWindowDays, mapping: JSON.stringify(i.mapping), options: JSON.stringify(i.options), line_count: i.lineCount,
      imported_by: i.by,
    })
    .returning('id');
  return row.id;
}

export type LineOutcome =
  | { type: 'proposed' }
  | { type: 'ambiguous'; reason: string; basis: string; candidates: { memoId: string; memoNumber: string; daysApart: number }[]; candidateCount: number }
  | { type: 'unmatched'; reason: string };

export type NewStatementLine = { lineNo: number; reference: string | null; amountMinor: number; date: string; currency: string; dealerId: string | null; outcome: LineOutcome };

/** Inserts the lines in batches; returns line number → id. */
export async function insertStatementLines(trx: Knex, importId: string, lines: readonly NewStatementLine[]): Promise<Map<number, string>> {
  const ids = new Map<number, string>();
  for (let i = 0; i < lines.length; i += 1000) {
    const rows = await trx('statement_lines')
      .insert(
        lines.slice(i, i + 1000).map((l) => ({
          import_id: importId, line_no: l.lineNo, reference: l.reference, amount_minor: l.amountMinor, line_date: l.date,
          currency: l.currency, dealer_id: l.dealerId, outcome: JSON.stringify(l.outcome),
        })),
      )
      .returning(['id', 'line_no']);
    for (const r of rows) ids.set(r.line_no, r.id);
  }
  return ids;
}

export type NewMatch = { brandId: string; lineId: string; memoId: string; basis: 'reference' | 'amount_date' | 'chosen'; referenceField: string | null; amountDifferenceMinor: number; daysApart: number; by: string; note?: string };

/** Proposals with their "proposed" log rows. */
export async function insertMatches(trx: Knex, matches: readonly NewMatch[]): Promise<string[]> {
  const out: string[] = [];
  for (let i = 0; i < matches.length; i += 1000) {
    const batch = matches.slice(i, i + 1000);
    const rows = await trx('reconciliation_matches')
      .insert(
        batch.map((m) => ({
          brand_id: m.brandId, statement_line_id: m.lineId, memo_id: m.memoId, basis: m.basis, reference_field: m.referenceField,
          amount_difference_minor: m.amountDifferenceMinor, days_apart: m.daysApart, proposed_by: m.by,
        })),
      )
      .returning('id');
    await trx('reconciliation_events').insert(
      rows.map((r: { id: string }, j: number) => ({ brand_id: batch[j]!.brandId, match_id: r.id, event: 'proposed', actor_id: batch[j]!.by, note: batch[j]!.note ?? null })),
    );
    out.push(...rows.map((r: { id: string }) => r.id));
  }
  return out;
}

/** The brand's memos free to be matched: no proposal waiting, not confirmed. */
export async function memosOpenForMatching(trx: Knex, brandId: string): Promise<MemoForMatching[]> {
  const rows = await trx('credit_memos as m')
    .select('m.id', 'm.number', 'm.claim_number as claimNumber', 'm.rma_number as rmaNumber', 'm.dealer_id as dealerId', 'm.currency', 'm.total_minor as totalMinor', 'm.issued_on as issuedOn')
    .where('m.brand_id', brandId)
    .whereNotExists((s) => s.select(trx.raw('1')).from('reconciliation_matches as x').whereRaw('x.memo_id = m.id').whereIn('x.status', ['proposed', 'confirmed']));
  return rows;
}

export type MatchRecord = {
  id: string;
  status: 'proposed' | 'confirmed' | 'rejected';
  basis: string;
  referenceField: string | null;
  amountDifferenceMinor: number;
  daysApart: number;
  decidedAt: string | null;
  decidedByName: string | null;
  memoId: string;
  memoNumber: string;
  memoKind: string;
  memoTotalMinor: number;
  memoCurrency: string;
  memoDealerId: string;
  memoReversed: boolean;
  claimId: string;
  claimNumber: string;
  lineId: string;
  lineNo: number;
  lineAmountMinor: number;
  lineCurrency: string;
  lineDealerId: string | null;
  importId: string;
  fileName: string;
};

function matchBase(q: Knex) {
  return q('reconciliation_matches as x')
    .join('credit_memos as m', 'm.id', 'x.memo_id')
    .join('statement_lines as l', 'l.id', 'x.statement_line_id')
    .join('statement_imports as i', 'i.id', 'l.import_id')
    .leftJoin('users as u', 'u.id', 'x.decided_by')
    .select(
      'x.id', 'x.status', 'x.basis', 'x.reference_field as referenceField', 'x.amount_difference_minor as amountDifferenceMinor',
      'x.days_apart as daysApart', 'x.decided_at as decidedAt', 'u.name as decidedByName', 'm.id as memoId', 'm.number as memoNumber',
      'm.kind as memoKind', 'm.total_minor as memoTotalMinor', 'm.currency as memoCurrency', 'm.dealer_id as memoDealerId',
      q.raw('EXISTS (SELECT 1 FROM credit_memos r WHERE r.reverses_memo_id = m.id) as "memoReversed"'),
      'm.claim_id as claimId', 'm.claim_number as claimNumber', 'l.id as lineId', 'l.line_no as lineNo', 'l.amount_minor as lineAmountMinor',
      'l.currency as lineCurrency', q.raw('coalesce(l.dealer_id, i.dealer_id) as "lineDealerId"'), 'i.id as importId', 'i.file_name as fileName',
    );
}

export async function findMatch(brandId: string, id: string, q: Knex = db(), lock = false): Promise<MatchRecord | null> {
  const b = matchBase(q).where({ 'x.brand_id': brandId, 'x.id': id });
  if (lock) b.forUpdate('x');
  return ((await b.first()) as MatchRecord | undefined) ?? null;
}

export async function liveMatchOfLine(lineId: string, q: Knex = db()): Promise<MatchRecord | null> {
  return ((await matchBase(q).where('x.statement_line_id', lineId).whereIn('x.status', ['proposed', 'confirmed']).first()) as MatchRecord | undefined) ?? null;
}

export async function liveMatchOfMemo(memoId: string, q: Knex = db()): Promise<MatchRecord | null> {
  return ((await matchBase(q).where('x.memo_id', memoId).whereIn('x.status', ['proposed', 'confirmed']).first()) as MatchRecord | undefined) ?? null;
}

/** A reversed memo is owed to nobody: its open proposals are rejected, each with the reason in the log. */
export async function rejectProposalsOfMemo(trx: Knex, m: { brandId: string; memoId: string; by: string; note: string }): Promise<number> {
  const rows = await trx('reconciliation_matches')
    .where({ memo_id: m.memoId, status: 'proposed' })
    .update({ status: 'rejected', decided_by: m.by, decided_at: trx.fn.now(), note: m.note })
    .returning('id');
  if (rows.length) {
    await trx('reconciliation_events').insert(rows.map((r: { id: string }) => ({ brand_id: m.brandId, match_id: r.id, event: 'rejected', actor_id: m.by, note: m.note })));
  }
  return rows.length;
}

/** A proposal is decided once; false when it was decided already (the caller re-reads why). */
export async function decideMatch(trx: Knex, m: { brandId: string; id: string; status: 'confirmed' | 'rejected'; by: string; note?: string }): Promise<boolean> {
  const n = await trx('reconciliation_matches')
    .where({ id: m.id, status: 'proposed' })
    .update({ status: m.status, decided_by: m.by, decided_at: trx.fn.now(), note: m.note ?? null });
  if (n !== 1) return false;
  await trx('reconciliation_events').insert({ brand_id: m.brandId, match_id: m.id, event: m.status, actor_id: m.by, note: m.note ?? null });
  return true;
}

export type StatementLineRow = {
  id: string;
  lineNo: number;
  reference: string | null;
  amountMinor: number;
  date: string;
  currency: string;
  dealerId: string | null;
  dealerName: string | null;
  outcome: LineOutcome;
  match: Pick<MatchRecord, 'id' | 'status' | 'basis' | 'referenceField' | 'amountDifferenceMinor' | 'daysApart' | 'memoId' | 'memoNumber' | 'memoTotalMinor' | 'claimId' | 'claimNumber' | 'decidedAt' | 'decidedByName'> | null;
  rejected: string[];
};

export type LineFilter = 'all' | 'proposed' | 'confirmed' | 'open';

export async function statementLines(importId: string, filter: LineFilter, page: number, pageSize: number): Promise<{ rows: StatementLineRow[]; total: number }> {
  const q = db();
  const live = (status: string[]) => (s: Knex.QueryBuilder) =>
    s.select(q.raw('1')).from('reconciliation_matches as x').whereRaw('x.statement_line_id = l.id').whereIn('x.status', status);
  const base = () => {
    const b = q('statement_lines as l').where('l.import_id', importId);
    if (filter === 'proposed') b.whereExists(live(['proposed']));
    if (filter === 'confirmed') b.whereExists(live(['confirmed']));
    if (filter === 'open') b.whereNotExists(live(['proposed', 'confirmed']));
    return b;
  };
  const [count, lines] = await Promise.all([
    base().count<{ n: string }[]>('l.id as n').first(),
    base()
      .leftJoin('organisations as d', 'd.id', 'l.dealer_id')
      .select('l.id', 'l.line_no as lineNo', 'l.reference', 'l.amount_minor as amountMinor', 'l.line_date as date', 'l.currency', 'l.dealer_id as dealerId', 'd.name as dealerName', 'l.outcome')
      .orderBy('l.line_no')
      .limit(pageSize)
      .offset((page - 1) * pageSize),
  ]);
  const ids = lines.map((l) => l.id);
  const matches = ids.length ? ((await matchBase(q).whereIn('x.statement_line_id', ids).orderBy('x.created_at')) as MatchRecord[]) : [];
  return {
    total: Number(count?.n ?? 0),
    rows: lines.map((l) => {
      const mine = matches.filter((m) => m.lineId === l.id);
      const liveMatch = mine.find((m) => m.status !== 'rejected') ?? null;
      return { ...l, match: liveMatch, rejected: mine.filter((m) => m.status === 'rejected').map((m) => m.memoNumber) };
    }),
  };
}

export async function findStatementLine(brandId: string, lineId: string, q: Knex = db(), lock = false) {
  const b = q('statement_lines as l')
    .join('statement_imports as i', 'i.id', 'l.import_id')
    .select('l.id', 'l.line_no as lineNo', 'l.amount_minor as amountMinor', 'l.line_date as date', 'l.currency', q.raw('coalesce(l.dealer_id, i.dealer_id) as "dealerId"'), 'i.id as importId', 'i.file_name as fileName')
    .where({ 'i.brand_id': brandId, 'l.id': lineId });
  if (lock) b.forUpdate('l');
  return (await b.first()) as { id: string; lineNo: number; amountMinor: number; date: string; currency: string; dealerId: string | null; importId: string; fileName: string } | undefined;
}

export type UnmatchedMemo = { id: string; number: string; claimId: string; claimNumber: string; dealerName: string; kind: string; totalMinor: number; currency: string; issuedOn: string };

/** Issued memos with no match waiting or confirmed, oldest first. */
export async function unmatchedMemos(brandId: string, dealerId: string | null, limit: number): Promise<{ rows: UnmatchedMemo[]; total: number }> {
  const q = db();
  const base = () => {
    const b = q('credit_memos as m')
      .where('m.brand_id', brandId)
      .whereNotExists((s) => s.select(q.raw('1')).from('reconciliation_matches as x').whereRaw('x.memo_id = m.id').whereIn('x.status', ['proposed', 'confirmed']));
    if (dealerId) b.where('m.dealer_id', dealerId);
    return b;
  };
  const [count, rows] = await Promise.all([
    base().count<{ n: string }[]>('m.id as n').first(),
    base()
      .join('organisations as d', 'd.id', 'm.dealer_id')
      .select('m.id', 'm.number', 'm.claim_id as claimId', 'm.claim_number as claimNumber', 'd.name as dealerName', 'm.kind', 'm.total_minor as totalMinor', 'm.currency', 'm.issued_on as issuedOn')
      .orderBy([{ column: 'm.issued_on' }, { column: 'm.number' }])
      .limit(limit),
  ]);
  return { total: Number(count?.n ?? 0), rows };
}

/** The brand's dealer accounts by account number (statements from the accounting system name them). */
export async function accountsByNumber(brandId: string, q: Knex = db()): Promise<Map<string, { dealerId: string; dealerName: string }>> {
  const rows = await q('dealer_accounts as a').join('organisations as d', 'd.id', 'a.dealer_id').select('a.account_number', 'a.dealer_id', 'd.name').where('a.brand_id', brandId);
  return new Map(rows.map((r) => [String(r.account_number).toUpperCase(), { dealerId: r.dealer_id, dealerName: r.name }]));
}
