import { describe, expect, it } from 'vitest';
import { db } from '@/db/connection';
import { parseDocumentNumber } from '@/lib/credits';
import { createDraft } from '@/lib/services/claims';
import { actAs } from '../../support/acting-user';
import { findActiveUser } from '@/lib/db/users';
import { orgId, tag } from './support';

describe('claim numbers', () => {
  it('a shop filing with two brands never gets one number twice, and every number carries a valid check digit', async () => {
    const userId = (await actAs('rita.vance@lanternhill.test'))!;
    const rita = (await findActiveUser(userId))!;
    const brands = [await orgId('torvane'), await orgId('wrenfield')];
    // Alternate brands, and file two at once, as a busy counter would.
    const made = await Promise.all(
      Array.from({ length: 8 }, (_, i) => createDraft(rita, { brandId: brands[i % 2]!, frameSerial: `NUM-${tag()}-${i}`, parts: [], labor: [], partSerial: '', symptom: '', errorCodes: '', description: '', customerName: '', customerEmail: '', customerPhone: '', freight: '' })),
    );
    const numbers = made.map((m) => m.number);
    expect(new Set(numbers).size).toBe(numbers.length);
    for (const n of numbers) expect(parseDocumentNumber(n)).toMatchObject({ ok: true, kind: 'claim', canonical: n });
    // The database holds the rule itself, whatever the code does.
    const dup = numbers[0]!;
    await expect(db()('claims').where({ id: made[1]!.id }).update({ number: dup })).rejects.toThrow(/claims_number_unique/);
  });
});

describe('the new-claim form sent twice', () => {
  it('one form key makes one draft, also when both requests arrive at once', async () => {
    const userId = (await actAs('rita.vance@lanternhill.test'))!;
    const rita = (await findActiveUser(userId))!;
    const brandId = await orgId('torvane');
    const frameSerial = `KEY-${tag()}`;
    const input = { brandId, frameSerial, clientKey: crypto.randomUUID(), parts: [], labor: [], partSerial: '', symptom: '', errorCodes: '', description: '', customerName: '', customerEmail: '', customerPhone: '', freight: '' };
    const [a, b] = await Promise.all([createDraft(rita, input), createDraft(rita, input)]);
    const c = await createDraft(rita, input);
    expect(new Set([a.id, b.id, c.id]).size).toBe(1);
    expect(await db()('claims').where({ frame_serial: frameSerial }).count('id as n').first()).toMatchObject({ n: 1 });
  });
});
