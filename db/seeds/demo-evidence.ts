import { createHash, randomUUID } from 'node:crypto';
import { HeadBucketCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import type { Knex } from 'knex';
import sharp from 'sharp';
import { env } from '@/lib/env';
import { cleanPhoto } from '@/lib/files/photos';
import type { TestConditions } from '@/lib/loadtest';
import { analyseUpload, legalClassId, loadTestKindFor, type LoadTestSpec } from '@/lib/loadtest-evidence';
import type { Actor } from '@/machines/claim';
import { repairRuns, type RepairRunsInput } from './demo-load-test-files';

// Evidence on a demo claim, stored and recorded as a dealer's upload would be: the file in the
// bucket under a sealed key, the attachment row with its SHA-256, an EVIDENCE_ADDED entry on the
// claim's log, and for a load test the analysis by the same pure code as the server.

export type Conditions = Partial<TestConditions>;
export type DemoFile = { name: string; text: string; conditions: Conditions };

export const conditions = (c: Conditions): TestConditions => ({
  batterySocStartPct: null, tyreSize: null, measuredCircumferenceMm: null, tyrePressurePa: null, tyreMaxPressurePa: null, dynoId: null,
  rollerId: null, loadKg: null, ambientTempC: null, notes: '', ...c,
});

export type DemoEvidence = {
  /** A serial-label photo and two photos of the fault (the least a claim is submitted with). */
  photos(claimId: string, by: Actor, label: { partNumber: string; partSerial: string }, at: string): Promise<void>;
  /** Any other photo (e.g. a disposal receipt); returns the attachment id. */
  photo(claimId: string, by: Actor, kind: string, fileName: string, caption: string, at: string): Promise<string>;
  loadTest(claimId: string, by: Actor, phase: 'before' | 'after', file: DemoFile, at: string): Promise<{ runId: string; meets: boolean }>;
  /** A before and an after run for the claim's part, bike and filer's units, on one bench under the same conditions. */
  repairFiles(claimId: string, o: Pick<RepairRunsInput, 'seed' | 'after' | 'beforeFraction'>): Promise<{ before: DemoFile; after: DemoFile }>;
};

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');

function s3(): S3Client {
  const e = env();
  return new S3Client({
    endpoint: e.S3_ENDPOINT, region: e.S3_REGION, forcePathStyle: e.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY },
  });
}

async function labelPhoto(text: string, sub: string): Promise<Buffer> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="960" height="640"><rect width="960" height="640" fill="#3b3f42"/>
    <rect x="140" y="200" width="680" height="240" rx="16" fill="#f2f0ea"/>
    <text x="180" y="290" font-family="monospace" font-size="44" fill="#111">${text}</text>
    <text x="180" y="360" font-family="monospace" font-size="28" fill="#444">${sub}</text></svg>`;
  return sharp(Buffer.from(svg)).jpeg({ quality: 85 }).toBuffer();
}

/** Null when the storage is not reachable: the sections that need it are added on a later start. */
export async function openDemoEvidence(knex: Knex): Promise<DemoEvidence | null> {
  const storage = s3();
  const bucket = env().S3_BUCKET;
  try {
    await storage.send(new HeadBucketCommand({ Bucket: bucket }));
  } catch {
    return null;
  }
  const put = (key: string, body: Buffer, contentType: string) => storage.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: body, ContentType: contentType }));
  // The claim's state at that time: the last step logged before it, else the current one.
  const stateOf = async (claimId: string, at: string) => {
    const step = await knex('claim_events').where({ claim_id: claimId }).where('created_at', '<=', at).orderBy('created_at', 'desc').orderBy('id', 'desc').first('to_state');
    return JSON.stringify(step ? step.to_state : (await knex('claims').where({ id: claimId }).first('state_value')).state_value);
  };

  const attach = async (claimId: string, by: Actor, kind: string, fileName: string, bytes: Buffer, contentType: string, at: string, thumbnail?: Buffer) => {
    const key = `evidence/${claimId}/${randomUUID()}/${fileName}`;
    await put(key, bytes, contentType);
    let thumbKey: string | null = null;
    if (thumbnail) {
      thumbKey = `${key}.thumb.webp`;
      await put(thumbKey, thumbnail, 'image/webp');
    }
    const [row] = await knex('attachments')
      .insert({ claim_id: claimId, kind, storage_key: key, thumbnail_key: thumbKey, file_name: fileName, content_type: contentType, size_bytes: bytes.length, sha256: sha(bytes), uploaded_by: by.id, created_at: at })
      .returning('id');
    return { id: row.id as string, sha256: sha(bytes) };
  };
  const logged = async (claimId: string, by: Actor, at: string, payload: Record<string, unknown>) => {
    const state = await stateOf(claimId, at);
    await knex('claim_events').insert({ claim_id: claimId, actor_id: by.id, actor_role: by.role, event: 'EVIDENCE_ADDED', from_state: state, to_state: state, payload: JSON.stringify(payload), created_at: at });
  };

  const photo: DemoEvidence['photo'] = async (claimId, by, kind, fileName, caption, at) => {
    const clean = await cleanPhoto(await labelPhoto(caption, 'DEMO PHOTO'), 'image/jpeg');
    const a = await attach(claimId, by, kind, fileName, clean.photo, 'image/jpeg', at, clean.thumbnail);
    await logged(claimId, by, at, { attachmentId: a.id, kind, fileName, sha256: a.sha256 });
    return a.id;
  };

  const specFor = async (claimId: string): Promise<{ kind: 'dyno' | 'battery'; spec: LoadTestSpec }> => {
    const c = await knex('claims as c').join('parts as p', 'p.id', 'c.part_id').leftJoin('bike_models as m', 'm.id', 'c.model_id').where('c.id', claimId)
      .first('c.brand_id', 'p.part_number', 'p.category', 'p.min_wheel_power_w', 'p.min_wheel_torque_nm', 'p.rated_capacity_ah', 'p.nominal_voltage_v', 'm.legal_class');
    const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));
    const kind = loadTestKindFor(c.category);
    if (kind === 'battery') {
      const policy = await knex('warranty_policies').where({ brand_id: c.brand_id, category: 'battery' }).first('capacity_threshold_pct');
      return { kind, spec: { kind, ratedCapacityAh: Number(c.rated_capacity_ah), nominalVoltageV: num(c.nominal_voltage_v), thresholdPct: num(policy?.capacity_threshold_pct), partNumber: c.part_number } };
    }
    return { kind, spec: { kind, minWheelPowerW: num(c.min_wheel_power_w), minWheelTorqueNm: num(c.min_wheel_torque_nm), legalClass: c.legal_class ? legalClassId(c.legal_class) : null, partNumber: c.part_number } };
  };

  const repairFiles: DemoEvidence['repairFiles'] = async (claimId, o) => {
    const row = await knex('claims as c').join('parts as p', 'p.id', 'c.part_id').join('bike_models as m', 'm.id', 'c.model_id').join('users as u', 'u.id', 'c.created_by')
      .where('c.id', claimId).first('p.part_number', 'p.category', 'p.rated_capacity_ah', 'p.nominal_voltage_v', 'm.tyre_size', 'm.legal_class', 'u.units');
    const runs = repairRuns({
      ...o, category: row.category, partNumber: row.part_number, tyre: row.tyre_size, legalClass: row.legal_class,
      ratedCapacityAh: row.rated_capacity_ah === null ? null : Number(row.rated_capacity_ah), nominalVoltageV: row.nominal_voltage_v === null ? null : Number(row.nominal_voltage_v),
      units: row.units === 'imperial' ? 'imperial' : 'metric',
    });
    const bench: Conditions = row.category === 'battery'
      ? { batterySocStartPct: 100, ambientTempC: 20, notes: 'Charged overnight, rested 1 h before the test.' }
      : { batterySocStartPct: 100, tyreSize: row.tyre_size, dynoId: 'Shop dyno', rollerId: 'Main roller', loadKg: 80, ambientTempC: 20 };
    return { before: { ...runs.before, conditions: bench }, after: { ...runs.after, conditions: bench } };
  };

  return {
    photo,
    repairFiles,
    async photos(claimId, by, label, at) {
      await photo(claimId, by, 'serial_label_photo', 'serial-label.jpg', `SN ${label.partSerial}`, at);
      await photo(claimId, by, 'photo', 'part-on-bench.jpg', `${label.partNumber} on the bench`, at);
      await photo(claimId, by, 'photo', 'fault-close-up.jpg', `${label.partNumber} fault close-up`, at);
    },
    async loadTest(claimId, by, phase, file, at) {
      const { kind, spec } = await specFor(claimId);
      const bytes = Buffer.from(file.text);
      const c = conditions(file.conditions);
      const result = analyseUpload(bytes, { kind, spec, conditions: c });
      if (result.status !== 'ok') throw new Error(`demo load test ${file.name} did not analyse: ${JSON.stringify(result).slice(0, 300)}`);
      const a = await attach(claimId, by, `load_test_${phase}`, file.name, bytes, 'text/csv', at);
      const runId = randomUUID();
      await knex('load_test_runs').insert({
        id: runId, claim_id: claimId, attachment_id: a.id, phase, kind, header_signature: result.signature, column_mapping: JSON.stringify(result.columnMapping),
        mapping_source: 'recognised', conditions: JSON.stringify(c), summary: JSON.stringify(result.summary), warnings: JSON.stringify(result.warnings),
        spec: JSON.stringify(spec), meets_spec: result.verdict.meets, sample_count: result.sampleCount, created_by: by.id, created_at: at, updated_at: at,
      });
      await logged(claimId, by, at, { attachmentId: a.id, kind: `load_test_${phase}`, fileName: file.name, sha256: a.sha256, loadTestId: runId, meetsSpec: result.verdict.meets });
      return { runId, meets: result.verdict.meets };
    },
  };
}
