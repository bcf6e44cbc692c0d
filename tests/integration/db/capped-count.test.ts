import { describe, expect, it } from 'vitest';
import { db } from '@/db/connection';
import { cappedCount, COUNT_CAP } from '@/lib/db/paging';

const rows = (n: number) => db().from(db().raw('generate_series(1, ?) as g(i)', [n]));

describe('counting a table’s rows up to the cap', () => {
  it('is exact up to the cap and says so beyond it', async () => {
    expect(await cappedCount(rows(7))).toEqual({ total: 7, totalCapped: false });
    expect(await cappedCount(rows(COUNT_CAP))).toEqual({ total: COUNT_CAP, totalCapped: false });
    expect(await cappedCount(rows(COUNT_CAP + 1))).toEqual({ total: COUNT_CAP, totalCapped: true });
    expect(await cappedCount(rows(25_000))).toEqual({ total: COUNT_CAP, totalCapped: true });
  });

  it('keeps the filter and ignores the order of the query it counts', async () => {
    const q = rows(3000).where('i', '<=', 40).orderBy('i', 'desc');
    expect(await cappedCount(q)).toEqual({ total: 40, totalCapped: false });
    expect(await cappedCount(rows(0))).toEqual({ total: 0, totalCapped: false });
  });
});
