import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';

import { COUNT_CAP } from '@/lib/paging';

export { COUNT_CAP };

export type PageTotal = { total: number; totalCapped: boolean };

export async function cappedCount(filtered: Knex.QueryBuilder, cap = COUNT_CAP): Promise<PageTotal> {
  const inner = filtered.clone().clearSelect().clearOrder().select(db().raw('1')).limit(cap + 1);
  const row = await db().count<{ n: string }[]>('* as n').from(inner.as('capped')).first();
  const n = Number(row?.n ?? 0);
  return { total: Math.min(n, cap), totalCapped: n > cap };
}
