import { describe, expect, it } from 'vitest';
import { db } from '@/db/connection';
import { headObject } from '@/lib/storage/s3';
import {
  addLoadTest,
  claimRow,
  draftClaim,
  driveToShipped,
  dynoCsv,
  PEOPLE,
  runsOf,
  step,
} from '../../support/load-test-claims';

// DU85 spec in the demo catalog: at least 300 W and 24 N·m at the wheel. dynoCsv({ peakW: 520 })
// peaks at 520 W (torque ≈ 34 N·m there) and meets it; dynoCsv({ peakW: 210 }) falls short on power.
const passing = () => ({ name: 'after-ok.csv', bytes: dynoCsv({ peakW: 520 }), kind: 'load_test_after' as const });
const failing = () => ({ name: 'after-weak.csv', bytes: dynoCsv({ peakW: 210 }), kind: 'load_test_after' as const });

async function shippedClaim() {
  const claim = await draftClaim();
  const before = await addLoadTest(PEOPLE.kettenblatt, claim.id, { name: 'before.csv', bytes: dynoCsv({ peakW: 180 }) });
  expect(before.status).toBe(201);
  await driveToShipped(claim.id);
  expect((await claimRow(claim.id)).replacement_step).toBe('shipped');
  return claim;
}

const versionOf = async (id: string) => (await claimRow(id)).version as number;

describe('the after-test gate', () => {
  it('a passing after-test marks the replacement fitted and verified in one step', async () => {
    const claim = await shippedClaim();
    const up = await addLoadTest(PEOPLE.kettenblatt, claim.id, passing());
    expect(up.status).toBe(201);
    expect(up.body).toMatchObject({ phase: 'after', meetsSpec: true });
    // Uploading alone changes no state.
    expect((await claimRow(claim.id)).replacement_step).toBe('shipped');

    const res = await step(PEOPLE.kettenblatt, claim.id, { type: 'MARK_FITTED', version: await versionOf(claim.id), afterTestId: up.body.runId });
    expect(res.status).toBe(200);
    const row = await claimRow(claim.id);
    expect(row.replacement_step).toBe('verified');
    expect(row.context.afterTest).toMatchObject({ outcome: 'passed', attempts: 1, lastTestId: up.body.runId });
    const ev = await db()('claim_events').where({ claim_id: claim.id, event: 'MARK_FITTED' }).first();
    expect(ev.payload).toEqual({ afterTestId: up.body.runId, afterTestPasses: true });
    // The assigned rep hears about it.
    const note = await db()('notifications').where({ claim_id: claim.id, kind: 'after_test_passed' }).first();
    expect(note).toBeDefined();

    // Verified: no further after-test is taken, and nothing is left of the refused file.
    const late = await addLoadTest(PEOPLE.kettenblatt, claim.id, passing());
    expect(late.status).toBe(409);
    expect(late.body.error).toMatch(/already verified/);
    expect(await headObject(late.storageKey!)).toBeNull();
    expect((await runsOf(claim.id)).filter((r) => r.phase === 'after')).toHaveLength(1);
  });

  it('a failing after-test waits for the rep, and the browser cannot say it passed', async () => {
    const claim = await shippedClaim();
    const up = await addLoadTest(PEOPLE.kettenblatt, claim.id, failing());
    expect(up.body).toMatchObject({ phase: 'after', meetsSpec: false });
    expect(up.body.verdict).toMatch(/Below by \d+\.\d %: peak wheel power/);

    const forged = await step(PEOPLE.kettenblatt, claim.id, { type: 'MARK_FITTED', version: await versionOf(claim.id), afterTestId: up.body.runId, afterTestPasses: true });
    expect(forged.status).toBe(200);
    const row = await claimRow(claim.id);
    expect(row.replacement_step).toBe('fitted');
    expect(row.context.afterTest).toMatchObject({ outcome: 'failed', lastTestId: up.body.runId, settledAt: null });
    const ev = await db()('claim_events').where({ claim_id: claim.id, event: 'MARK_FITTED' }).first();
    expect(ev.payload.afterTestPasses).toBe(false);
    expect(await db()('notifications').where({ claim_id: claim.id, kind: 'after_test_failed' }).first()).toBeDefined();

    // A second MARK_FITTED (a double click) is refused by the machine and changes nothing.
    const again = await step(PEOPLE.kettenblatt, claim.id, { type: 'MARK_FITTED', afterTestId: up.body.runId });
    expect(again.status).toBe(409);
    expect((await claimRow(claim.id)).version).toBe(row.version);

    // Sending the same failing run again as a new after-test is refused.
    const same = await step(PEOPLE.kettenblatt, claim.id, { type: 'SUBMIT_AFTER_TEST', afterTestId: up.body.runId });
    expect(same.status).toBe(409);
    expect(same.body.error).toMatch(/sent already/);

    // A new, passing run verifies the repair.
    const second = await addLoadTest(PEOPLE.kettenblatt, claim.id, passing());
    const sent = await step(PEOPLE.kettenblatt, claim.id, { type: 'SUBMIT_AFTER_TEST', version: await versionOf(claim.id), afterTestId: second.body.runId, afterTestPasses: false });
    expect(sent.status).toBe(200);
    const done = await claimRow(claim.id);
    expect(done.replacement_step).toBe('verified');
    expect(done.context.afterTest).toMatchObject({ outcome: 'passed', attempts: 2, lastTestId: second.body.runId });
  });

  it('the rep accepts a failing after-test by hand, with a reason; others cannot', async () => {
    const claim = await shippedClaim();
    const up = await addLoadTest(PEOPLE.kettenblatt, claim.id, failing());
    await step(PEOPLE.kettenblatt, claim.id, { type: 'MARK_FITTED', afterTestId: up.body.runId });
    expect((await claimRow(claim.id)).replacement_step).toBe('fitted');

    const dealer = await step(PEOPLE.kettenblatt, claim.id, { type: 'ACCEPT_BY_HAND', reason: 'I think it is fine really' });
    expect(dealer.status).toBe(403);
    const foreign = await step(PEOPLE.wrenfieldRep, claim.id, { type: 'ACCEPT_BY_HAND', reason: 'Another brand deciding this claim' });
    expect(foreign.status).toBe(404);
    const short = await step(PEOPLE.torvaneRep, claim.id, { type: 'ACCEPT_BY_HAND', reason: 'ok' });
    expect(short.status).toBe(422);
    expect(JSON.stringify(short.body)).toMatch(/at least 10 characters/);
    expect((await claimRow(claim.id)).replacement_step).toBe('fitted');

    const reason = 'Roller slipped on the second half of the run; the rider reports full assistance back.';
    const ok = await step(PEOPLE.torvaneRep, claim.id, { type: 'ACCEPT_BY_HAND', version: await versionOf(claim.id), reason });
    expect(ok.status).toBe(200);
    const row = await claimRow(claim.id);
    expect(row.replacement_step).toBe('verified');
    expect(row.context.afterTest).toMatchObject({ outcome: 'accepted_by_hand', acceptedReason: reason });
    expect(await db()('notifications').where({ claim_id: claim.id, kind: 'after_test_accepted' }).first()).toBeDefined();
  });

  it('refuses an after-test in a wrong state, a run of another claim, and a run that is not an after-test', async () => {
    const claim = await draftClaim();
    const before = await addLoadTest(PEOPLE.kettenblatt, claim.id, { name: 'before.csv', bytes: dynoCsv({ peakW: 180 }) });
    // Draft: the after-test kind cannot even be uploaded.
    const early = await addLoadTest(PEOPLE.kettenblatt, claim.id, passing());
    expect(early.status).toBe(409);

    await driveToShipped(claim.id, PEOPLE.kettenblatt, { stopAfter: 'APPROVE' });
    expect((await claimRow(claim.id)).replacement_step).toBe('to_ship');
    // Approved but not shipped: the file is refused and removed from storage; nothing is recorded.
    const notShipped = await addLoadTest(PEOPLE.kettenblatt, claim.id, passing());
    expect(notShipped.status).toBe(409);
    expect(notShipped.body.error).toMatch(/not shipped yet/);
    expect(await headObject(notShipped.storageKey!)).toBeNull();
    expect((await runsOf(claim.id)).filter((r) => r.phase === 'after')).toHaveLength(0);

    // MARK_FITTED with the before-test: not an after-test.
    const withBefore = await step(PEOPLE.kettenblatt, claim.id, { type: 'MARK_FITTED', afterTestId: before.body.runId });
    expect(withBefore.status).toBe(422);

    // An after-test of another claim.
    const other = await shippedClaim();
    const otherRun = await addLoadTest(PEOPLE.kettenblatt, other.id, passing());
    const version = await versionOf(claim.id);
    const borrowed = await step(PEOPLE.kettenblatt, claim.id, { type: 'MARK_FITTED', afterTestId: otherRun.body.runId, afterTestPasses: true });
    expect(borrowed.status).toBe(422);
    expect(await versionOf(claim.id)).toBe(version);

    // No after-test named at all.
    const none = await step(PEOPLE.kettenblatt, claim.id, { type: 'MARK_FITTED', afterTestPasses: true });
    expect(none.status).toBe(422);
    expect((await claimRow(claim.id)).replacement_step).toBe('to_ship');
  });

  it('a battery claim: the after-discharge is held to the brand’s capacity threshold', async () => {
    // BP625: 17.4 Ah rated, Torvane's threshold 70 % (demo catalog). Constant-current discharges
    // integrate in closed form: 4.35 A × 2 h = 8.7 Ah (50 %); 8.7 A × 2 h = 17.4 Ah (100 %).
    const discharge = (amps: number) => {
      const lines = ['time_s,voltage_v,current_a'];
      for (let t = 0; t <= 7200; t += 30) lines.push(`${t},${(41 - (9 * t) / 7200).toFixed(4)},${amps}`);
      return Buffer.from(lines.join('\n') + '\n');
    };
    const claim = await draftClaim({ partNumber: 'TV-BP625', batteryCycles: 420 });
    const before = await addLoadTest(PEOPLE.kettenblatt, claim.id, { name: 'before.csv', bytes: discharge(4.35) }, { conditions: { batterySocStartPct: '100' } });
    expect(before.body).toMatchObject({ status: 'stored', meetsSpec: false });
    expect(before.body.verdict).toBe('Capacity is 50.0 % of rated, below the 70 % threshold by 20.0 points.');
    await driveToShipped(claim.id);
    const after = await addLoadTest(PEOPLE.kettenblatt, claim.id, { name: 'after.csv', bytes: discharge(8.7), kind: 'load_test_after' }, { conditions: { batterySocStartPct: '100' } });
    expect(after.body).toMatchObject({ phase: 'after', meetsSpec: true });
    const res = await step(PEOPLE.kettenblatt, claim.id, { type: 'MARK_FITTED', afterTestId: after.body.runId });
    expect(res.status).toBe(200);
    expect((await claimRow(claim.id)).replacement_step).toBe('verified');
  });

  it('two fitted steps at once: exactly one goes through', async () => {
    const claim = await shippedClaim();
    const up = await addLoadTest(PEOPLE.kettenblatt, claim.id, passing());
    const version = await versionOf(claim.id);
    const body = { type: 'MARK_FITTED', version, afterTestId: up.body.runId };
    const results = await Promise.all([step(PEOPLE.kettenblatt, claim.id, body), step(PEOPLE.kettenblatt, claim.id, body)]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    expect(await db()('claim_events').where({ claim_id: claim.id, event: 'MARK_FITTED' })).toHaveLength(1);
    expect((await claimRow(claim.id)).version).toBe(version + 1);
  });
});
