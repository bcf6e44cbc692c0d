// The database keeps each brand's and each dealer's rows together, whatever the code does:
// a claim cannot point at another brand's part, bike or account, an account is in its brand's
// currency, and a memo or parcel belongs to its claim's brand.
import { describe, expect, it } from 'vitest';
import { db } from '@/db/connection';
import { approvedClaim } from '../../support/approved-claims';

const org = async (slug: string) => (await db()('organisations').where({ slug }).first('id', 'currency')) as { id: string; currency: string | null };
const partOf = async (brandId: string) => (await db()('parts').where({ brand_id: brandId }).first('id')).id as string;
const FOREIGN_KEY = /violates foreign key constraint/;

describe('composite keys across tenants', () => {
  it('a claim refuses another brand’s part, model, registered bike and dealer account', async () => {
    const claim = await approvedClaim({ failedPart: 'TV-CT20' });
    const wrenfield = await org('wrenfield');
    const before = await db()('claims').where({ id: claim.id }).first('part_id', 'model_id', 'registered_unit_id', 'dealer_account_id', 'version');
    const theirModel = (await db()('bike_models').where({ brand_id: wrenfield.id }).first('id')).id;
    const theirUnit = (await db()('registered_units').where({ brand_id: wrenfield.id }).first('id')).id;
    const theirAccount = (await db()('dealer_accounts').where({ brand_id: wrenfield.id }).first('id')).id;
    for (const change of [{ part_id: await partOf(wrenfield.id) }, { model_id: theirModel }, { registered_unit_id: theirUnit }, { dealer_account_id: theirAccount }]) {
      await expect(db()('claims').where({ id: claim.id }).update(change)).rejects.toThrow(FOREIGN_KEY);
    }
    expect(await db()('claims').where({ id: claim.id }).first('part_id', 'model_id', 'registered_unit_id', 'dealer_account_id', 'version')).toEqual(before);
  });

  it('a claim refuses an account of the same brand that belongs to another dealer', async () => {
    const claim = await approvedClaim({ failedPart: 'TV-CT20' });
    const torvane = await org('torvane');
    const row = await db()('claims').where({ id: claim.id }).first('dealer_id');
    const otherShops = (await db()('dealer_accounts').where({ brand_id: torvane.id }).whereNot({ dealer_id: row.dealer_id }).first('id')).id;
    await expect(db()('claims').where({ id: claim.id }).update({ dealer_account_id: otherShops })).rejects.toThrow(FOREIGN_KEY);
  });

  it('a dealer account is kept in its brand’s currency', async () => {
    const torvane = await org('torvane');
    const account = await db()('dealer_accounts').where({ brand_id: torvane.id }).first('id', 'currency');
    expect(account.currency).toBe(torvane.currency);
    await expect(db()('dealer_accounts').where({ id: account.id }).update({ currency: torvane.currency === 'USD' ? 'EUR' : 'USD' })).rejects.toThrow(FOREIGN_KEY);
  });

  it('a parcel and stock belong to the claim’s and part’s own brand', async () => {
    const claim = await approvedClaim({ failedPart: 'TV-CT20' });
    const wrenfield = await org('wrenfield');
    await expect(
      db()('shipments').insert({
        claim_id: claim.id, brand_id: wrenfield.id, direction: 'outbound', carrier: 'ferrule', service: 'road', transport: 'ground', tracking_number: `FP-TEST-${Date.now()}`,
      }),
    ).rejects.toThrow(FOREIGN_KEY);
    const shelf = await db()('stock_levels').where({ brand_id: (await org('torvane')).id }).first('part_id');
    await expect(db()('stock_levels').where({ part_id: shelf.part_id }).update({ brand_id: wrenfield.id })).rejects.toThrow(FOREIGN_KEY);
  });
});
