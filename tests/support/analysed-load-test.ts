import { createHash, randomUUID } from 'node:crypto';
import { db } from '@/db/connection';
import { analyseUpload, type LoadTestSpec } from '@/lib/loadtest-evidence';

// A load test as the upload route leaves it (attachment + analysed run), for tests that need a
// claim with its evidence but are not about load tests; the file itself is not put in storage.
// A claim is only submitted with an analysed before-test: a bare `load_test_before` row does not count.

/** A clean dyno sweep in our column layout whose power peaks at `peakW` near 20 km/h (57-622 tyre). */
export function sweepCsv(peakW = 520, n = 400): string {
  const r = (Math.PI * (622 + 2 * 57)) / 1000 / (2 * Math.PI);
  const lines = ['time_s,speed_kmh,wheel_torque_nm,wheel_power_w'];
  for (let i = 0; i < n; i++) {
    const kmh = 2 + (23 * i) / n;
    const p = Math.max(5, peakW * Math.exp(-(((kmh - 20) / 9) ** 2)));
    lines.push(`${(i * 0.05).toFixed(2)},${kmh.toFixed(3)},${(p / (kmh / 3.6 / r)).toFixed(3)},${p.toFixed(2)}`);
  }
  return lines.join('\n') + '\n';
}

export async function insertAnalysedLoadTest(
  claimId: string,
  uploadedBy: string,
  opts: { phase?: 'before' | 'after'; peakW?: number; spec?: LoadTestSpec } = {},
): Promise<{ runId: string; attachmentId: string; meetsSpec: boolean }> {
  const phase = opts.phase ?? 'before';
  // Judged against the claim's own failed part, as the load-test route judges it.
  const part = await db()('claims as c').leftJoin('parts as p', 'p.id', 'c.part_id').where('c.id', claimId).first('p.part_number as partNumber');
  const spec: LoadTestSpec = opts.spec ?? { kind: 'dyno', minWheelPowerW: 300, minWheelTorqueNm: 24, legalClass: 'eu-pedelec', partNumber: part?.partNumber ?? null };
  const bytes = Buffer.from(sweepCsv(opts.peakW));
  const conditions = {
    batterySocStartPct: 100, tyreSize: '57-622', measuredCircumferenceMm: null, tyrePressurePa: 400_000, tyreMaxPressurePa: 400_000,
    dynoId: 'Bench 1', rollerId: null, loadKg: null, ambientTempC: 20, notes: '',
  };
  const result = analyseUpload(bytes, { kind: 'dyno', spec, conditions });
  if (result.status !== 'ok') throw new Error('the test sweep did not analyse');
  const [att] = await db()('attachments')
    .insert({
      claim_id: claimId, kind: `load_test_${phase}`, storage_key: `tests/${claimId}/${randomUUID()}.csv`, file_name: `${phase}.csv`, content_type: 'text/csv',
      size_bytes: bytes.length, sha256: createHash('sha256').update(bytes).digest('hex'), uploaded_by: uploadedBy,
    })
    .returning('id');
  const runId = randomUUID();
  await db()('load_test_runs').insert({
    id: runId, claim_id: claimId, attachment_id: att.id, phase, kind: 'dyno', header_signature: result.signature,
    column_mapping: JSON.stringify(result.columnMapping), mapping_source: 'recognised', conditions: JSON.stringify(conditions),
    summary: JSON.stringify(result.summary), warnings: JSON.stringify(result.warnings), spec: JSON.stringify(spec),
    meets_spec: result.verdict.meets, sample_count: result.sampleCount, created_by: uploadedBy,
  });
  return { runId, attachmentId: att.id, meetsSpec: result.verdict.meets };
}
