import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import type { CreditLine, CreditMemoDraft, CreditMemoKind } from '@/lib/credits';
import { memoLineRow } from '@/lib/db/memo-rows';
import type { AppUser } from '@/lib/db/users';
import type { CurrencyCode } from '@/lib/money';

/** An issued memo's header, with where it stands in reconciliation. */
export type MemoRow = {
  id: string;
  brandId: string;
  brandName: string;
  dealerId: string;
  dealerName: string;
  claimId: string;
  number: string;
  kind: CreditMemoKind;
  dealerAccountNumber: string;
  claimNumber: string;
  rmaNumber: string | null;
  currency: CurrencyCode;
  totalMinor: number;
  issuedOn: string;
  issuedAt: string;
  issuedByName: string | null;
  reversesMemoId: string | null;
  reversesMemoNumber: string | null;
  reversedByMemoId: string | null;
  reversedByNumber: string | null;
  reason: string | null;
  /** Confirmed against a statement line. */
  reconciledAt: string | null;
  /** A proposal waits for the accountant. */
  proposed: boolean;
};

export type StoredMemo = MemoRow & { lines: CreditLine[] };

const memoColumns = [
  'm.id', 'm.brand_id as brandId', 'b.name as brandName', 'm.dealer_id as dealerId', 'd.name as dealerName', 'm.claim_id as claimId',
  'm.number', 'm.kind', 'm.dealer_account_number as dealerAccountNumber', 'm.claim_number as claimNumber', 'm.rma_number as rmaNumber',
  'm.currency', 'm.total_minor as totalMinor', 'm.issued_on as issuedOn', 'm.issued_at as issuedAt', 'u.name as issuedByName',
  'm.reverses_memo_id as reversesMemoId', 'rv.number as reversesMemoNumber', 'rb.id as reversedByMemoId', 'rb.number as reversedByNumber',
  'm.reason',
];

function memoBase(q: Knex) {
  return q('credit_memos as m')
    .join('organisations as b', 'b.id', 'm.brand_id')
    .join('organisations as d', 'd.id', 'm.dealer_id')
    .leftJoin('users as u', 'u.id', 'm.issued_by')
    .leftJoin('credit_memos as rv', 'rv.id', 'm.reverses_memo_id')
    .leftJoin('credit_memos as rb', 'rb.reverses_memo_id', 'm.id')
    .select(memoColumns)
    .select(
      q.raw(`(SELECT max(x.decided_at) FROM reconciliation_matches x WHERE x.memo_id = m.id AND x.status = 'confirmed') as "reconciledAt"`),
      q.raw(`EXISTS (SELECT 1 FROM reconciliation_matches x WHERE x.memo_id = m.id AND x.status = 'proposed') as "proposed"`),
    );
}

/** Tenant rule for memos: brand staff see their brand's, a dealer its own shop's. */
export function scopeMemos<T extends Knex.QueryBuilder>(q: T, user: Pick<AppUser, 'orgKind' | 'organisationId'>, alias = 'm'): T {
  return q.where(`${alias}.${user.orgKind === 'dealer' ? 'dealer_id' : 'brand_id'}`, user.organisationId) as T;
}

function toMemo(r: Record<string, unknown>): MemoRow {
  return {
    ...(r as MemoRow),
    issuedAt: new Date(r.issuedAt as string).toISOString(),
    reconciledAt: r.reconciledAt ? new Date(r.reconciledAt as string).toISOString() : null,
  };
}

function toLine(r: Record<string, unknown>): CreditLine {
  return {
    lineNo: r.line_no as number,
    kind: r.kind as CreditLine['kind'],
    status: r.status as CreditLine['status'],
    description: r.description as string,
    ...(r.part_number ? { partNumber: r.part_number as string } : {}),
    ...(r.category ? { category: r.category as string } : {}),
    ...(r.labor_code ? { laborCode: r.labor_code as string } : {}),
    computedMinor: r.computed_minor as number,
    amountMinor: r.amount_minor as number,
    basis: r.basis as CreditLine['basis'],
    adjustments: r.adjustments as CreditLine['adjustments'],
    ...(r.reverses_line_no !== null ? { reversesLineNo: r.reverses_line_no as number } : {}),
  };
}

export async function linesOfMemos(memoIds: readonly string[], q: Knex = db()): Promise<Map<string, CreditLine[]>> {
  const out = new Map<string, CreditLine[]>(memoIds.map((id) => [id, []]));
  if (memoIds.length === 0) return out;
  for (let i = 0; i < memoIds.length; i += 5000) {
    const rows = await q('credit_memo_lines').whereIn('memo_id', memoIds.slice(i, i + 5000)).orderBy(['memo_id', 'line_no']);
    for (const r of rows) out.get(r.memo_id)?.push(toLine(r));
  }
  return out;
}

async function withLines(rows: MemoRow[], q: Knex): Promise<StoredMemo[]> {
  const lines = await linesOfMemos(rows.map((r) => r.id), q);
  return rows.map((r) => ({ ...r, lines: lines.get(r.id) ?? [] }));
}

export async function findMemoForUser(user: AppUser, id: string, q: Knex = db()): Promise<StoredMemo | null> {
  const r = await scopeMemos(memoBase(q).where('m.id', id), user).first();
  return r ? (await withLines([toMemo(r)], q))[0]! : null;
}

export async function findMemoByNumber(brandId: string, number: string, q: Knex = db()): Promise<MemoRow | null> {
  const r = await memoBase(q).where({ 'm.brand_id': brandId, 'm.number': number }).first();
  return r ? toMemo(r) : null;
}

export async function findMemoByKey(key: string, q: Knex = db()): Promise<MemoRow | null> {
  const r = await memoBase(q).where('m.idempotency_key', key).first();
  return r ? toMemo(r) : null;
}

export async function memosOfClaim(claimId: string, q: Knex = db()): Promise<StoredMemo[]> {
  const rows = (await memoBase(q).where('m.claim_id', claimId).orderBy('m.issued_at')).map(toMemo);
  return withLines(rows, q);
}

export type MemoListQuery = {
  page: number;
  pageSize: number;
  status?: 'open' | 'reconciled';
  kind?: CreditMemoKind;
  q?: string;
  dealerId?: string;
  brandId?: string;
  from?: string;
  to?: string;
};

export async function listMemos(user: AppUser, query: MemoListQuery): Promise<{ rows: MemoRow[]; total: number }> {
  const filter = (b: Knex.QueryBuilder) => {
    scopeMemos(b, user);
    if (query.kind) b.where('m.kind', query.kind);
    if (query.dealerId) b.where('m.dealer_id', query.dealerId);
    if (query.brandId) b.where('m.brand_id', query.brandId);
    if (query.from) b.where('m.issued_on', '>=', query.from);
    if (query.to) b.where('m.issued_on', '<=', query.to);
    const confirmed = `EXISTS (SELECT 1 FROM reconciliation_matches x WHERE x.memo_id = m.id AND x.status = 'confirmed')`;
    if (query.status === 'open') b.whereRaw(`NOT ${confirmed}`);
    if (query.status === 'reconciled') b.whereRaw(confirmed);
    if (query.q) {
      const like = `%${query.q.replace(/[%_\\]/g, (m) => `\\${m}`)}%`;
      b.where((w) => w.whereILike('m.number', like).orWhereILike('m.claim_number', like).orWhereILike('m.rma_number', like));
    }
    return b;
  };
  const [count, rows] = await Promise.all([
    filter(db()('credit_memos as m')).count<{ n: string }[]>('m.id as n').first(),
    filter(memoBase(db()))
      .orderBy([{ column: 'm.issued_on', order: 'desc' }, { column: 'm.number', order: 'desc' }])
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize),
  ]);
  return { total: Number(count?.n ?? 0), rows: rows.map(toMemo) };
}

/** Memos with their lines for an export or a report, oldest first. */
export async function memosWithLines(
  scope: { brandId?: string; dealerId?: string },
  period: { from?: string; to?: string } = {},
  q: Knex = db(),
): Promise<StoredMemo[]> {
  const b = memoBase(q);
  if (scope.brandId) b.where('m.brand_id', scope.brandId);
  if (scope.dealerId) b.where('m.dealer_id', scope.dealerId);
  if (period.from) b.where('m.issued_on', '>=', period.from);
  if (period.to) b.where('m.issued_on', '<=', period.to);
  const rows = (await b.orderBy([{ column: 'm.issued_on' }, { column: 'm.number' }])).map(toMemo);
  return withLines(rows, q);
}

export type NewMemo = CreditMemoDraft & {
  number: string;
  brandId: string;
  dealerId: string;
  dealerAccountId: string;
  claimId: string;
  dealerAccountNumber: string;
  claimNumber: string;
  rmaNumber: string | null;
  issuedOn: string;
  issuedBy: string | null;
  idempotencyKey: string;
  draftHash: string;
  reversesMemoId?: string | null;
  reason?: string | null;
};

/** Writes an issued memo and its lines; the database checks at commit that the total foots. */
export async function insertMemo(trx: Knex, m: NewMemo): Promise<string> {
  const [row] = await trx('credit_memos')
    .insert({
      brand_id: m.brandId, dealer_id: m.dealerId, dealer_account_id: m.dealerAccountId, claim_id: m.claimId, number: m.number,
      kind: m.kind, dealer_account_number: m.dealerAccountNumber, claim_number: m.claimNumber, rma_number: m.rmaNumber,
      currency: m.currency, total_minor: m.totalMinor, issued_on: m.issuedOn, issued_by: m.issuedBy,
      idempotency_key: m.idempotencyKey, draft_hash: m.draftHash, reverses_memo_id: m.reversesMemoId ?? null, reason: m.reason ?? null,
    })
    .returning('id');
  await trx('credit_memo_lines').insert(m.lines.map((l) => memoLineRow(row.id, l)));
  return row.id;
}

export type DraftEdit = { id: number; lineNo: number; lineKind: string; amountMinor: number; reason: string; by: string; byName: string; at: string };

export async function draftEditsOf(claimId: string, q: Knex = db()): Promise<DraftEdit[]> {
  const rows = await q('credit_draft_edits as e')
    .join('users as u', 'u.id', 'e.edited_by')
    .select('e.id', 'e.line_no as lineNo', 'e.line_kind as lineKind', 'e.amount_minor as amountMinor', 'e.reason', 'e.edited_by as by', 'u.name as byName', 'e.created_at as at')
    .where('e.claim_id', claimId)
    .orderBy('e.id');
  return rows.map((r) => ({ ...r, at: new Date(r.at).toISOString() }));
}

export async function insertDraftEdit(trx: Knex, e: { claimId: string; lineNo: number; lineKind: string; amountMinor: number; reason: string; by: string }): Promise<void> {
  await trx('credit_draft_edits').insert({
    claim_id: e.claimId, line_no: e.lineNo, line_kind: e.lineKind, amount_minor: e.amountMinor, reason: e.reason, edited_by: e.by,
  });
}
