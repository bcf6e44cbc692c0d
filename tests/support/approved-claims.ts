import { db } from '@/db/connection';
import { insertApprovedClaim, type ApprovedClaimSpec } from '@/db/seeds/approved-claims';

let n = 0;
const unique = (prefix: string) => `${prefix}-${Date.now().toString(36).toUpperCase()}-${(n++).toString(36).toUpperCase()}${Math.floor(Math.random() * 1e4)}`;

const BRAND_DEFAULTS = {
  torvane: { approvedBy: 'priya.nair@torvane.test' },
  wrenfield: { approvedBy: 'ines.costa@wrenfield.test' },
} as const;

/**
 * An approved claim with its RMA, built through the machine (submit → take → approve) until the
 * rep's approval screen makes them. Serials are unique per call, so tests never collide.
 */
export async function approvedClaim(spec: Partial<ApprovedClaimSpec> & { brand?: 'torvane' | 'wrenfield'; failedPart: string; lines?: ApprovedClaimSpec['lines'] }) {
  const brand = spec.brand ?? 'torvane';
  return insertApprovedClaim(db(), {
    dealer: 'kettenblatt',
    filedBy: 'lena.hartmann@kettenblatt.test',
    frameSerial: unique('TEST-FRAME'),
    partSerial: unique('TEST-PART'),
    symptom: 'Test symptom',
    description: 'Made by a test',
    lines: [{ part: spec.failedPart }],
    ...BRAND_DEFAULTS[brand],
    ...spec,
    brand,
  });
}

/** Sets a part's stock for a test (an adjustment logged like any other). */
export async function setStock(brand: 'torvane' | 'wrenfield', partNumber: string, onHand: number, restockExpectedOn: string | null = null): Promise<string> {
  const b = await db()('organisations').where({ slug: brand }).first('id');
  const p = await db()('parts').where({ brand_id: b.id, part_number: partNumber }).first('id');
  await db().transaction(async (trx) => {
    const before = await trx('stock_levels').where({ part_id: p.id }).forUpdate().first('on_hand');
    await trx('stock_levels')
      .insert({ part_id: p.id, brand_id: b.id, on_hand: onHand, restock_expected_on: restockExpectedOn })
      .onConflict('part_id')
      .merge({ on_hand: onHand, restock_expected_on: restockExpectedOn });
    const delta = onHand - Number(before?.on_hand ?? 0);
    if (delta !== 0) {
      await trx('stock_movements').insert({ brand_id: b.id, part_id: p.id, kind: 'adjustment', delta, on_hand_after: onHand, reason: 'count_correction', note: 'set by a test' });
    }
  });
  return p.id;
}

export async function onHand(partId: string): Promise<number> {
  return Number((await db()('stock_levels').where({ part_id: partId }).first('on_hand'))?.on_hand ?? 0);
}

/**
 * Records an attachment row as a finished upload would (the upload path itself is tested with the
 * evidence screens); enough for steps that need a photo on the claim.
 */
export async function attachRecord(claimId: string, kind: string, uploaderEmail: string): Promise<string> {
  const user = await db()('users').whereRaw('lower(email) = lower(?)', [uploaderEmail]).first('id');
  const key = `claims/${claimId}/test-${Date.now()}-${Math.random().toString(36).slice(2)}/photo.jpg`;
  const [row] = await db()('attachments')
    .insert({
      claim_id: claimId, kind, storage_key: key, file_name: `${kind}.jpg`, content_type: 'image/jpeg', size_bytes: 1234,
      sha256: 'a'.repeat(64), uploaded_by: user.id,
    })
    .returning('id');
  return row.id;
}
