import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';

export type DealerAccount = {
  id: string; dealerId: string; brandId: string; brandName: string; dealerName: string; accountNumber: string;
  laborRateMinor: number; currency: string; maxLaborRateMinor: number;
};

const columns = [
  'a.id', 'a.dealer_id as dealerId', 'a.brand_id as brandId', 'b.name as brandName', 'd.name as dealerName',
  'a.account_number as accountNumber', 'a.labor_rate_minor as laborRateMinor', 'a.currency', 'b.max_labor_rate_minor as maxLaborRateMinor',
];

function base(q: Knex) {
  return q('dealer_accounts as a').join('organisations as b', 'b.id', 'a.brand_id').join('organisations as d', 'd.id', 'a.dealer_id');
}

export async function findDealerAccount(dealerId: string, brandId: string, q: Knex = db()): Promise<DealerAccount | null> {
  return (await base(q).select(columns).where({ 'a.dealer_id': dealerId, 'a.brand_id': brandId }).first()) ?? null;
}

export async function dealerAccounts(dealerId: string): Promise<DealerAccount[]> {
  return base(db()).select(columns).where('a.dealer_id', dealerId).orderBy('b.name');
}

export async function brandDealerAccounts(brandId: string): Promise<DealerAccount[]> {
  return base(db()).select(columns).where('a.brand_id', brandId).orderBy('d.name');
}

export type BrandDealerRow = DealerAccount & { city: string; country: string; claims: number };

/** The brand's dealers with where they are and how many claims they have sent. */
export async function brandDealerList(brandId: string, q: Knex = db()): Promise<BrandDealerRow[]> {
  return base(q)
    .select([...columns, 'd.city', 'd.country', q.raw(`(SELECT count(*)::int FROM claims c WHERE c.dealer_account_id = a.id AND c.submitted_at IS NOT NULL) AS claims`)])
    .where('a.brand_id', brandId)
    .orderBy('d.name');
}

export async function setLaborRate(brandId: string, accountId: string, laborRateMinor: number, q: Knex = db()): Promise<boolean> {
  return (await q('dealer_accounts').where({ brand_id: brandId, id: accountId }).update({ labor_rate_minor: laborRateMinor })) === 1;
}

/** Account numbers with the brand, upper-cased → dealer organisation id (registry import). */
export async function dealersByAccountNumber(brandId: string, q: Knex = db()): Promise<Map<string, string>> {
  const rows = await q('dealer_accounts').select('account_number as n', 'dealer_id as d').where({ brand_id: brandId });
  return new Map(rows.map((r: { n: string; d: string }) => [r.n.toUpperCase(), r.d]));
}
