import { beforeAll, describe, expect, it } from 'vitest';
import { POST as stepRoute } from '@/app/api/claims/[id]/steps/route';
import { db } from '@/db/connection';
import { actAs } from '../../support/acting-user';
import { addCompleteEvidence, call, createDraft, eventsOf, PEOPLE, registerBike, submit, submittedClaim, tag } from './support';

const t = tag();
const step = (id: string, body: Record<string, unknown>) => call(stepRoute, { method: 'POST', path: `/api/claims/${id}/steps`, params: { id }, body });
const stateOf = async (id: string) => db()('claims').where({ id }).first('stage', 'version', 'state_value', 'submitted_at');

describe('one step at a time', () => {
  it('two SUBMITs at the same moment: exactly one wins, one SUBMIT event, the loser gets 409 with the current state', async () => {
    await registerBike(`SC${t}-1`);
    const claim = await createDraft(PEOPLE.dealer, `SC${t}-1`);
    await addCompleteEvidence(claim.id);
    const { version } = await stateOf(claim.id);
    const results = await Promise.all([submit(claim.id, version), submit(claim.id, version), submit(claim.id)]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409, 409]);
    const losers = results.filter((r) => r.status === 409);
    for (const l of losers) expect(l.body).toMatchObject({ stage: 'submitted', version: version + 1 });
    expect(await eventsOf(claim.id, 'SUBMIT')).toHaveLength(1);
    expect(await stateOf(claim.id)).toMatchObject({ stage: 'submitted', version: version + 1 });
  });

  it('a duplicate submit (the same button twice, one after the other) records one SUBMIT and changes nothing the second time', async () => {
    const claim = await submittedClaim(`SC${t}-2`);
    const after = await stateOf(claim.id);
    const events = (await eventsOf(claim.id)).length;
    const again = await submit(claim.id, after.version - 1);
    expect(again.status).toBe(409);
    expect(again.body.error).toMatch(/changed since you opened it/);
    const withoutVersion = await submit(claim.id);
    expect(withoutVersion.status).toBe(409);
    expect(withoutVersion.body).toMatchObject({ stage: 'submitted' });
    expect(await stateOf(claim.id)).toEqual(after);
    expect(await eventsOf(claim.id)).toHaveLength(events);
    expect(await eventsOf(claim.id, 'SUBMIT')).toHaveLength(1);
  });

  it('a concurrent WITHDRAW and SUBMIT on a draft: one of them happens, never both', async () => {
    await registerBike(`SC${t}-3`);
    const claim = await createDraft(PEOPLE.dealer, `SC${t}-3`);
    await addCompleteEvidence(claim.id);
    const { version } = await stateOf(claim.id);
    const [a, b] = await Promise.all([submit(claim.id, version), step(claim.id, { type: 'WITHDRAW', version })]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const stepEvents = (await eventsOf(claim.id)).filter((e) => ['SUBMIT', 'WITHDRAW'].includes(e.event));
    expect(stepEvents).toHaveLength(1);
    expect((await stateOf(claim.id)).stage).toBe(stepEvents[0]!.event === 'SUBMIT' ? 'submitted' : 'withdrawn');
  });

  it('refusals: wrong role is 403, wrong state is 409, an incomplete draft lists what is missing; nothing changes', async () => {
    await registerBike(`SC${t}-4`);
    const claim = await createDraft(PEOPLE.dealer, `SC${t}-4`);
    const before = await stateOf(claim.id);
    const incomplete = await submit(claim.id);
    expect(incomplete.status).toBe(422);
    expect(incomplete.body.fieldErrors._form).toEqual(expect.arrayContaining([expect.stringMatching(/serial label/i)]));
    await addCompleteEvidence(claim.id);
    await submit(claim.id);
    const submitted = await stateOf(claim.id);
    const count = (await eventsOf(claim.id)).length;
    await actAs(PEOPLE.warehouse);
    expect((await step(claim.id, { type: 'SUBMIT' })).status).toBe(403);
    await actAs(PEOPLE.accountant);
    expect((await step(claim.id, { type: 'WITHDRAW' })).status).toBe(403);
    await actAs(PEOPLE.dealer);
    const refused = await step(claim.id, { type: 'SUBMIT' });
    expect(refused.status).toBe(409);
    expect(refused.body).toMatchObject({ stage: 'submitted', label: expect.any(String) });
    expect((await step(claim.id, { type: 'NOT_A_STEP' })).status).toBe(422);
    expect(await stateOf(claim.id)).toEqual(submitted);
    expect(await eventsOf(claim.id)).toHaveLength(count);
    expect(before.stage).toBe('draft');
  });
});

describe('the claim event log is append-only, enforced by the database', () => {
  let claimId: string;
  beforeAll(async () => {
    claimId = (await submittedClaim(`EL${t}-1`)).id;
  });

  it('refuses UPDATE, DELETE and TRUNCATE, and the rows stay as written', async () => {
    const before = await eventsOf(claimId);
    expect(before.length).toBeGreaterThanOrEqual(5);
    await expect(db()('claim_events').where({ claim_id: claimId }).update({ event: 'TAMPERED' })).rejects.toThrow(/append-only/);
    await expect(db()('claim_events').where({ claim_id: claimId }).update({ payload: JSON.stringify({}) })).rejects.toThrow(/append-only/);
    await expect(db()('claim_events').where({ id: before[0]!.id }).delete()).rejects.toThrow(/append-only/);
    await expect(db().raw('TRUNCATE claim_events')).rejects.toThrow(/append-only/);
    await expect(db().raw('TRUNCATE claim_events CASCADE')).rejects.toThrow(/append-only/);
    // Removing the claim itself would orphan its events; the foreign key refuses it.
    await expect(db()('claims').where({ id: claimId }).delete()).rejects.toThrow(/claim_events/);
    expect(await eventsOf(claimId)).toEqual(before);
  });

  it('inserts still work, in order, with who, from-state and to-state', async () => {
    const events = await eventsOf(claimId);
    const submitEvent = events.find((e) => e.event === 'SUBMIT')!;
    expect(submitEvent).toMatchObject({ actor_role: 'dealer', from_state: 'draft', to_state: 'submitted' });
    expect(submitEvent.payload.evidence).toMatchObject({ photos: 2, serialLabelPhotos: 1, beforeTests: 1, registered: true });
    expect(events.map((e) => e.event)).toEqual(['OPENED', 'EVIDENCE_ADDED', 'EVIDENCE_ADDED', 'EVIDENCE_ADDED', 'SUBMIT']);
  });
});
