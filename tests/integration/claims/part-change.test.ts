import { describe, expect, it } from 'vitest';
import { PATCH as patchClaimRoute } from '@/app/api/claims/[id]/route';
import { db } from '@/db/connection';
import { findClaimForUser } from '@/lib/db/claims';
import { findActiveUser } from '@/lib/db/users';
import { readinessOf } from '@/lib/services/claims';
import { actAs } from '../../support/acting-user';
import { addCompleteEvidence, call, createDraft, orgId, PEOPLE, registerBike, submit, tag } from './support';

describe('changing the failed part of a draft', () => {
  it('a before-test judged for the old part no longer counts: the claim asks for a new one and cannot be submitted', async () => {
    const frame = `PC-${tag()}`;
    await registerBike(frame);
    const draft = await createDraft(PEOPLE.dealer, frame);
    await addCompleteEvidence(draft.id);
    const me = (await findActiveUser((await actAs(PEOPLE.dealer))!))!;
    expect((await readinessOf((await findClaimForUser(me, draft.id))!)).missing).toEqual([]);

    const brandId = await orgId('torvane');
    const other = await db()('parts').where({ brand_id: brandId, part_number: 'TV-DU60' }).first('id');
    const claim = (await findClaimForUser(me, draft.id))!;
    const r = await call(patchClaimRoute, {
      method: 'PATCH', params: { id: draft.id },
      body: { version: claim.version, brandId, frameSerial: frame, partId: other.id, partSerial: 'DU60-X', failureDate: '2026-06-10', symptom: 'Assist cuts out on climbs', parts: [{ partId: other.id, quantity: 1 }] },
    });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    const missing = (await readinessOf((await findClaimForUser(me, draft.id))!)).missing;
    expect(missing.join(' ')).toMatch(/load test from before the repair/);
    const s = await submit(draft.id);
    expect(s.status).toBe(422);
  });
});
