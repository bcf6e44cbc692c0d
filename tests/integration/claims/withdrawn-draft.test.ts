import { describe, expect, it } from 'vitest';
import { GET as attachmentRoute } from '@/app/api/attachments/[id]/route';
import { GET as getClaimRoute } from '@/app/api/claims/[id]/route';
import { GET as listClaimsRoute } from '@/app/api/claims/route';
import { GET as reviewQueueRoute } from '@/app/api/review/route';
import { POST as stepRoute } from '@/app/api/claims/[id]/steps/route';
import { db } from '@/db/connection';
import { dealerHistoryCounts } from '@/lib/db/review';
import { actAs } from '../../support/acting-user';
import { labelPhoto } from '../../support/evidence-files';
import { call, createDraft, orgId, PEOPLE, registerBike, tag, upload } from './support';

describe('a draft withdrawn before it was ever submitted', () => {
  it('stays the shop’s own: the brand sees neither the claim, its files, nor a count of it', async () => {
    const frame = `WD-${tag()}`;
    await registerBike(frame);
    const draft = await createDraft(PEOPLE.dealer, frame, { customerName: 'Private Rider' });
    await actAs(PEOPLE.dealer);
    const up = await upload(draft.id, { kind: 'serial_label_photo', fileName: 'label.jpg', bytes: await labelPhoto('SN PRIVATE') });
    expect(up.complete?.status).toBe(200);
    const brand = await orgId('torvane');
    const dealer = await orgId('kettenblatt');
    const before = await dealerHistoryCounts(brand, dealer);

    const w = await call(stepRoute, { method: 'POST', params: { id: draft.id }, body: { type: 'WITHDRAW' } });
    expect(w.status).toBe(200);
    expect((await db()('claims').where({ id: draft.id }).first('stage')).stage).toBe('withdrawn');

    await actAs(PEOPLE.rep);
    expect((await call(getClaimRoute, { params: { id: draft.id } })).status).toBe(404);
    expect((await call(attachmentRoute, { params: { id: up.complete!.body.id } })).status).toBe(404);
    const list = await call(listClaimsRoute, { path: `/api/claims?q=${frame}` });
    expect(list.body.total).toBe(0);
    for (const view of ['decided', 'all']) {
      const q = await call(reviewQueueRoute, { path: `/api/review?view=${view}&q=${frame}` });
      expect(q.status).toBe(200);
      expect(q.body.total).toBe(0);
    }
    expect(await dealerHistoryCounts(brand, dealer)).toEqual(before);
    expect(JSON.stringify(list.body)).not.toContain('Private Rider');

    // The shop itself still has it.
    await actAs(PEOPLE.dealer);
    expect((await call(getClaimRoute, { params: { id: draft.id } })).body).toMatchObject({ stage: 'withdrawn', customerName: 'Private Rider' });
  });
});
