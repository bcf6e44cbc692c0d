import { randomBytes, randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { POST as completeUploadRoute } from '@/app/api/claims/[id]/uploads/[intentId]/route';
import { db } from '@/db/connection';
import { findClaimForUser } from '@/lib/db/claims';
import { evidenceSummaryFor, submitClaim } from '@/lib/services/claims';
import { removeAttachment } from '@/lib/services/evidence';
import { headObject } from '@/lib/storage/s3';
import { PSI_PA } from '@/lib/units';
import { actAs } from '../../support/acting-user';
import { insertAnalysedLoadTest } from '../../support/analysed-load-test';
import {
  addLoadTest,
  attachPhotos,
  attachmentsOf,
  draftClaim,
  dynoCsv,
  fixture,
  PEOPLE,
  putFile,
  recordLoadTest,
  runsOf,
  signedIn,
} from '../../support/load-test-claims';

const beforeTestsOf = async (claimId: string) => {
  const user = await signedIn(PEOPLE.kettenblatt);
  const claim = (await findClaimForUser(user, claimId))!;
  return (await evidenceSummaryFor(claim)).beforeTests;
};

/** Nothing of a refused file is left: no analysis, no attachment, no object in storage, no ticket. */
async function expectNothingStored(claimId: string, upload: { intentId?: string; storageKey?: string }) {
  expect(await runsOf(claimId)).toHaveLength(0);
  expect(await attachmentsOf(claimId, 'load_test_before')).toHaveLength(0);
  expect(await beforeTestsOf(claimId)).toBe(0);
  if (upload.storageKey) expect(await headObject(upload.storageKey)).toBeNull();
  if (upload.intentId) expect(await db()('upload_intents').where({ id: upload.intentId }).first()).toBeUndefined();
}

describe('a before-test is stored with its analysis', () => {
  it('reads our own columns, analyses on the server with the conditions given, and counts for submission', async () => {
    const claim = await draftClaim();
    expect(await beforeTestsOf(claim.id)).toBe(0);
    const res = await addLoadTest(PEOPLE.kettenblatt, claim.id, { name: 'dyno-mid-drive-metric.csv', bytes: fixture('dyno-mid-drive-metric.csv') }, {
      conditions: { tyreSize: '57-622', tyrePressure: '3,5', tyreMaxPressure: '4.0', batterySocStartPct: '100', dynoId: 'Bench 1', rollerId: 'R2', load: '80', ambientTemp: '19' },
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ status: 'stored', phase: 'before', meetsSpec: true, mappingSource: 'recognised' });

    const [run] = await runsOf(claim.id);
    expect(run).toMatchObject({ phase: 'before', kind: 'dyno', mapping_source: 'recognised', meets_spec: true });
    // Stored in SI: 3.5 bar = 350 000 Pa, 4.0 bar = 400 000 Pa (1 bar = 10^5 Pa exactly, NIST SP 811 B.8).
    expect(run.conditions).toMatchObject({ tyreSize: '57-622', tyrePressurePa: 350_000, tyreMaxPressurePa: 400_000, loadKg: 80, ambientTempC: 19, dynoId: 'Bench 1' });
    // Circumference π × (BSD + 2 × width) (Sheldon Brown, "Cyclecomputer Calibration"): 57-622 → 2312.2 mm (reference-values.md).
    expect(run.summary.metric.circumferenceM * 1000).toBeCloseTo(2312.2, 1);
    // The summary holds the binned curve in both unit systems, never the raw samples.
    expect(run.summary.metric.bins.length).toBeGreaterThan(10);
    expect(run.summary.imperial.binUnits).toBe('imperial');
    expect(run.sample_count).toBe(run.summary.metric.sampleCount);
    expect(JSON.stringify(run.summary).length).toBeLessThan(100_000);
    expect(run.summary.metric.bins[0]).not.toHaveProperty('samples');
    // The spec is frozen with the run (DU85: 300 W and 24 N·m at the wheel, demo catalog).
    expect(run.spec).toMatchObject({ kind: 'dyno', minWheelPowerW: 300, minWheelTorqueNm: 24, legalClass: 'eu-pedelec', partNumber: 'TV-DU85' });
    expect(run.column_mapping).toMatchObject({ time_s: { quantity: 'time', unit: 's' }, speed_kmh: { quantity: 'speed', unit: 'kmh' } });

    const [att] = await attachmentsOf(claim.id, 'load_test_before');
    expect(att.id).toBe(run.attachment_id);
    expect(await headObject(att.storage_key)).not.toBeNull();
    const note = await db()('claim_events').where({ claim_id: claim.id, event: 'EVIDENCE_ADDED' }).first();
    expect(note.payload).toMatchObject({ loadTestId: run.id, kind: 'load_test_before', meetsSpec: true });
    expect(await beforeTestsOf(claim.id)).toBe(1);
  });

  it('takes conditions in imperial units and stores them in SI', async () => {
    const claim = await draftClaim({ dealer: PEOPLE.lanternhill, frameSerial: 'SW25-010455' });
    const res = await addLoadTest(PEOPLE.lanternhill, claim.id, { name: 'hub.csv', bytes: fixture('dyno-hub-imperial.csv') }, {
      units: 'imperial',
      conditions: { tyreSize: '60-584', tyrePressure: '50', tyreMaxPressure: '50', load: '176', ambientTemp: '68', measuredCircumference: '87.00' },
    });
    expect(res.status).toBe(201);
    const [run] = await runsOf(claim.id);
    // psi → Pa from the exact lbf and inch (NIST SP 811 B.8: 6.894 757 E+03); lb → kg 0.453 592 37 exactly; 68 °F = 20 °C.
    expect(run.conditions.tyrePressurePa).toBeCloseTo(50 * 6894.757293168, 6);
    expect(PSI_PA).toBeCloseTo(6894.757, 3);
    expect(run.conditions.loadKg).toBeCloseTo(176 * 0.45359237, 9);
    expect(run.conditions.ambientTempC).toBeCloseTo(20, 9);
    // A measured roll-out wins over the ISO estimate: 87.00 in = 2209.8 mm (inch = 25.4 mm exactly).
    expect(run.conditions.measuredCircumferenceMm).toBeCloseTo(2209.8, 1);
    expect(run.summary.metric.circumferenceM).toBeCloseTo(2.2098, 4);
    expect(run.summary.circumference.source).toBe('measured');
    // Swift Commuter S is sold as US class 3 (28 mph, 36 CFR 1.4).
    expect(run.spec.legalClass).toBe('us-class-3');
  });

  it('analyses a battery discharge against the rated capacity and the brand threshold', async () => {
    const claim = await draftClaim({ partNumber: 'TV-BP625', batteryCycles: 310 });
    const res = await addLoadTest(PEOPLE.kettenblatt, claim.id, { name: 'discharge.csv', bytes: fixture('battery-discharge-36v.csv') }, { conditions: { batterySocStartPct: '100', ambientTemp: '21' } });
    expect(res.status).toBe(201);
    const [run] = await runsOf(claim.id);
    expect(run.kind).toBe('battery');
    expect(run.spec).toMatchObject({ kind: 'battery', ratedCapacityAh: 17.4, nominalVoltageV: 36, thresholdPct: 70 });
    const a = run.summary.analysis;
    expect(a.stateOfHealthPct).toBeCloseTo((a.deliveredAh / 17.4) * 100, 9);
    // Rated energy Wh = V × Ah (49 CFR 171.8): 36 V × 17.4 Ah = 626.4 Wh.
    expect(a.ratedEnergyWh).toBeCloseTo(626.4, 9);
    expect(run.meets_spec).toBe(a.stateOfHealthPct >= 70);
  });
});

describe('the stored run follows its file', () => {
  it('removing a wrong before-test from a draft removes its analysis, and the count drops', async () => {
    const claim = await draftClaim();
    await addLoadTest(PEOPLE.kettenblatt, claim.id, { name: 'run.csv', bytes: dynoCsv() });
    expect(await beforeTestsOf(claim.id)).toBe(1);
    const [att] = await attachmentsOf(claim.id, 'load_test_before');
    await removeAttachment(await signedIn(PEOPLE.kettenblatt), claim.id, att.id);
    expect(await runsOf(claim.id)).toHaveLength(0);
    expect(await beforeTestsOf(claim.id)).toBe(0);
  });

  it('the database refuses a run that does not match its file’s claim and phase', async () => {
    const claim = await draftClaim();
    await addLoadTest(PEOPLE.kettenblatt, claim.id, { name: 'run.csv', bytes: dynoCsv() });
    const [run] = await runsOf(claim.id);
    await expect(db()('load_test_runs').where({ id: run.id }).update({ phase: 'after' })).rejects.toThrow(/does not match its attachment/);
    const other = await draftClaim();
    await expect(db()('load_test_runs').where({ id: run.id }).update({ claim_id: other.id })).rejects.toThrow(/does not match its attachment/);
  });
});

describe('a file that cannot be analysed is refused with the library’s message and nothing is stored', () => {
  const cases: Array<[string, string | Buffer, RegExp]> = [
    ['blank lines only', '\n\n  \n', /empty/i],
    ['no speed column', 'time_s,wheel_power_w\n0,10\n0.1,12\n0.2,15\n', /no speed column/i],
    ['all-zero torque', 'time_s,speed_kmh,wheel_torque_nm\n0,1,0\n0.1,2,0\n0.2,3,0\n', /column 3 "wheel_torque_nm".*zero on every line/i],
    ['a single sample', 'time_s,speed_kmh,wheel_power_w\n0,10,200\n', /only one sample \(line 2\)/i],
    ['a negative value', 'time_s,speed_kmh,wheel_power_w\n0,10,200\n0.1,-11,210\n0.2,12,220\n', /line 3.*speed_kmh|speed_kmh.*line 3/i],
    ['a non-numeric value', 'time_s,speed_kmh,wheel_power_w\n0,10,200\n0.1,fast,210\n0.2,12,220\n', /line 3.*speed_kmh|speed_kmh.*line 3/i],
    ['a PDF with a .csv name', Buffer.from('%PDF-1.4\n1 0 obj\n<< /Type /Catalog >>\nendobj\n'), /not a CSV text file.*PDF/i],
  ];
  for (const [what, content, message] of cases) {
    it(what, async () => {
      const claim = await draftClaim();
      const res = await addLoadTest(PEOPLE.kettenblatt, claim.id, { name: 'run.csv', bytes: Buffer.isBuffer(content) ? content : Buffer.from(content) });
      expect(res.status).toBe(422);
      expect(res.body.error).toMatch(/could not be read as a dyno run; nothing was added/);
      expect(res.body.retryable).toBe(false);
      expect(res.body.issues.map((i: { message: string }) => i.message).join(' ')).toMatch(message);
      await expectNothingStored(claim.id, res);
    });
  }

  it('an empty or too-large file is refused before it is uploaded', async () => {
    const claim = await draftClaim();
    await actAs(PEOPLE.kettenblatt);
    const ask = (size: number) =>
      import('@/app/api/claims/[id]/uploads/route').then(({ POST }) =>
        POST(new Request('http://t', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ kind: 'load_test_before', fileName: 'big.csv', size, sha256: 'a'.repeat(64), contentType: 'text/csv' }) }), { params: Promise.resolve({ id: claim.id }) }),
      );
    const big = await ask(200 * 1024 * 1024);
    expect(big.status).toBe(422);
    expect((await big.json()).error).toMatch(/200\.0 MB.*up to 50 MB/);
    const empty = await ask(0);
    expect(empty.status).toBe(422);
    expect(await db()('upload_intents').where({ claim_id: claim.id })).toHaveLength(0);
    await expectNothingStored(claim.id, {});
  });

  it('a load-test file attached without an analysis does not count towards submission', async () => {
    const claim = await draftClaim();
    await db()('attachments').insert({
      claim_id: claim.id, kind: 'load_test_before', storage_key: `tests/${randomUUID()}.csv`, file_name: 'old.csv', content_type: 'text/csv',
      size_bytes: 10, sha256: randomBytes(32).toString('hex'), uploaded_by: claim.user.id,
    });
    expect(await beforeTestsOf(claim.id)).toBe(0);
    // The helper other tests use for a claim's evidence records the analysis too, and then it counts.
    await insertAnalysedLoadTest(claim.id, claim.user.id);
    expect(await beforeTestsOf(claim.id)).toBe(1);
  });

  it('the general upload completion does not record a load test without its analysis, and keeps the upload', async () => {
    const claim = await draftClaim();
    const put = await putFile(PEOPLE.kettenblatt, claim.id, 'load_test_before', 'run.csv', dynoCsv());
    const res = await completeUploadRoute(new Request('http://t', { method: 'POST' }), { params: Promise.resolve({ id: claim.id, intentId: put.intentId! }) });
    expect(res.status).toBe(422);
    expect((await res.json()).error).toMatch(/load-test form/);
    expect(await attachmentsOf(claim.id)).toHaveLength(0);
    // Still there for the load-test route.
    const ok = await recordLoadTest(PEOPLE.kettenblatt, claim.id, { intentId: put.intentId, units: 'metric', conditions: { tyreSize: '57-622' } });
    expect(ok.status).toBe(201);
  });
});

describe('conditions, mapping and refusals', () => {
  it('bad conditions are named by field and keep the upload for a corrected try', async () => {
    const claim = await draftClaim();
    const put = await putFile(PEOPLE.kettenblatt, claim.id, 'load_test_before', 'run.csv', dynoCsv());
    const bad = await recordLoadTest(PEOPLE.kettenblatt, claim.id, {
      intentId: put.intentId, units: 'metric', conditions: { tyreSize: '26 x 1 3/8', tyrePressure: 'high', batterySocStartPct: '120', ambientTemp: '75' },
    });
    expect(bad.status).toBe(422);
    expect(bad.body.fieldErrors.tyreSize[0]).toMatch(/fractional inch size/);
    expect(bad.body.fieldErrors.tyrePressure[0]).toMatch(/must be a number/);
    expect(bad.body.fieldErrors.batterySocStartPct[0]).toMatch(/between 0 % and 100 %/);
    expect(bad.body.fieldErrors.ambientTemp[0]).toMatch(/between -40 °C and 60 °C/);
    expect(await runsOf(claim.id)).toHaveLength(0);
    // Imperial ranges are worded in imperial units.
    const badImperial = await recordLoadTest(PEOPLE.kettenblatt, claim.id, { intentId: put.intentId, units: 'imperial', conditions: { tyreSize: '57-622', tyrePressure: '400' } });
    expect(badImperial.body.fieldErrors.tyrePressure[0]).toMatch(/between 0 psi and 290 psi/);
    // A dyno run needs the wheel's circumference: without a tyre size or roll-out it cannot be read.
    const noTyre = await recordLoadTest(PEOPLE.kettenblatt, claim.id, { intentId: put.intentId, units: 'metric', conditions: {} });
    expect(noTyre.status).toBe(422);
    expect(noTyre.body.fieldErrors.tyreSize[0]).toMatch(/tyre size/i);
    expect(await db()('upload_intents').where({ id: put.intentId }).first()).toBeDefined();
    const good = await recordLoadTest(PEOPLE.kettenblatt, claim.id, { intentId: put.intentId, units: 'metric', conditions: { tyreSize: '57-622', tyrePressure: '3.5' } });
    expect(good.status).toBe(201);
  });

  it('asks which column is what, remembers the answer for the dealer, and applies it next time', async () => {
    // One column name unique to this run, so no answer saved by an earlier run of the suite applies.
    const temp = `Motor temp ${randomBytes(3).toString('hex')} [°C]`;
    const file = () => Buffer.from(fixture('dyno-needs-mapping.csv').toString('utf8').replace('Motor temp [°C]', temp));
    const claim = await draftClaim();
    const first = await addLoadTest(PEOPLE.kettenblatt, claim.id, { name: 'bench-export.csv', bytes: file() });
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ status: 'needs-mapping', kind: 'dyno', intentId: first.intentId });
    expect(first.body.headers).toEqual(['Elapsed (s)', 'Roller speed [km/h]', 'Wheel torque [N·m]', temp]);
    expect(first.body.proposedMapping['Roller speed [km/h]']).toEqual({ quantity: 'speed', unit: 'kmh' });
    expect(await runsOf(claim.id)).toHaveLength(0);
    expect(await attachmentsOf(claim.id)).toHaveLength(0);

    // A wrong answer (two speed columns) is refused with the columns named, and the file kept.
    const wrong = await recordLoadTest(PEOPLE.kettenblatt, claim.id, {
      intentId: first.intentId, units: 'metric', conditions: { tyreSize: '57-622' },
      mapping: { 'Elapsed (s)': { quantity: 'time', unit: 's' }, 'Roller speed [km/h]': { quantity: 'speed', unit: 'kmh' }, 'Wheel torque [N·m]': { quantity: 'speed', unit: 'mph' }, [temp]: { quantity: 'ignore' } },
    });
    expect(wrong.status).toBe(422);
    expect(wrong.body.retryable).toBe(true);
    expect(wrong.body.issues[0].message).toMatch(/both hold speed/);
    expect(await db()('upload_intents').where({ id: first.intentId }).first()).toBeDefined();

    const mapping = { ...first.body.proposedMapping, [temp]: { quantity: 'ignore' } };
    const answered = await recordLoadTest(PEOPLE.kettenblatt, claim.id, { intentId: first.intentId, units: 'metric', conditions: { tyreSize: '57-622' }, mapping });
    expect(answered.status).toBe(201);
    expect(answered.body.mappingSource).toBe('entered');
    const kettenblatt = (await db()('organisations').where({ slug: 'kettenblatt' }).first('id')).id;
    const saved = await db()('load_test_mappings').where({ dealer_id: kettenblatt, kind: 'dyno' });
    expect(saved.map((s) => s.header_signature)).toContain((await runsOf(claim.id))[0].header_signature);

    // The same layout again, from a colleague at the same shop: read at once with the saved answer.
    const again = await addLoadTest(PEOPLE.kettenblattAdmin, claim.id, { name: 'bench-export-2.csv', bytes: file() });
    expect(again.status).toBe(201);
    expect(again.body.mappingSource).toBe('saved');

    // Another shop has not answered for this layout: it is asked.
    const other = await draftClaim({ dealer: PEOPLE.lanternhill, frameSerial: 'KU25-007812', partNumber: 'TV-DU60' });
    const asked = await addLoadTest(PEOPLE.lanternhill, other.id, { name: 'bench-export.csv', bytes: file() });
    expect(asked.body.status).toBe('needs-mapping');
  });

  it('refuses the wrong role, a foreign claim, a submitted claim and a repeated request', async () => {
    const claim = await draftClaim();
    const put = await putFile(PEOPLE.kettenblatt, claim.id, 'load_test_before', 'run.csv', dynoCsv());
    const body = { intentId: put.intentId, units: 'metric', conditions: { tyreSize: '57-622' } };

    const rep = await recordLoadTest(PEOPLE.torvaneRep, claim.id, body);
    expect(rep.status).toBe(403);
    const foreign = await recordLoadTest(PEOPLE.lanternhill, claim.id, body);
    expect(foreign.status).toBe(404);
    // Another user of the same shop cannot complete someone else's upload ticket.
    const colleague = await recordLoadTest(PEOPLE.kettenblattAdmin, claim.id, body);
    expect(colleague.status).toBe(404);
    expect(await runsOf(claim.id)).toHaveLength(0);

    // The same ticket sent twice at once: one records, the other is refused; the recorded file stays.
    const [a, b] = await Promise.all([recordLoadTest(PEOPLE.kettenblatt, claim.id, body), recordLoadTest(PEOPLE.kettenblatt, claim.id, body)]);
    expect([a.status, b.status].sort()).toEqual([201, expect.any(Number)]);
    expect([a.status, b.status].filter((s) => s === 201)).toHaveLength(1);
    expect([404, 409]).toContain([a.status, b.status].find((s) => s !== 201));
    expect(await runsOf(claim.id)).toHaveLength(1);
    // The recorded file lives under its own key (the upload key is spent); it survived the loser.
    const recorded = await db()('attachments').where({ claim_id: claim.id, kind: 'load_test_before' }).first('storage_key');
    expect(recorded.storage_key).not.toBe(put.storageKey);
    expect(await headObject(recorded.storage_key)).not.toBeNull();

    // Once submitted, no new before-test can be added by the dealer.
    await attachPhotos(claim.id, claim.user.id);
    await submitClaim(await signedIn(PEOPLE.kettenblatt), claim.id);
    const late = await putFile(PEOPLE.kettenblatt, claim.id, 'load_test_before', 'late.csv', dynoCsv());
    expect(late.status).toBe(409);
  });
});
