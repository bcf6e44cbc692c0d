import 'server-only';
import type { Knex } from 'knex';
import { db } from '@/db/connection';
import type { ColumnMapping } from '@/lib/loadtest';
import type { LoadTestConditionsSi, LoadTestKind, LoadTestPhase, LoadTestSpec, LoadTestSummary, MappingSource } from '@/lib/loadtest-evidence';

export type LoadTestRun = {
  id: string;
  claimId: string;
  attachmentId: string;
  fileName: string;
  sha256: string;
  phase: LoadTestPhase;
  kind: LoadTestKind;
  headerSignature: string;
  columnMapping: ColumnMapping;
  mappingSource: MappingSource;
  conditions: LoadTestConditionsSi;
  summary: LoadTestSummary;
  warnings: { code: string; message: string; row?: number }[];
  spec: LoadTestSpec;
  meetsSpec: boolean;
  sampleCount: number;
  createdBy: string;
  createdByName: string | null;
  createdAt: Date;
};

const columns = [
  'r.id', 'r.claim_id as claimId', 'r.attachment_id as attachmentId', 'a.file_name as fileName', 'a.sha256', 'r.phase', 'r.kind',
  'r.header_signature as headerSignature', 'r.column_mapping as columnMapping', 'r.mapping_source as mappingSource', 'r.conditions',
  'r.summary', 'r.warnings', 'r.spec', 'r.meets_spec as meetsSpec', 'r.sample_count as sampleCount', 'r.created_by as createdBy',
  'u.name as createdByName', 'r.created_at as createdAt',
];

function base(q: Knex) {
  return q('load_test_runs as r').join('attachments as a', 'a.id', 'r.attachment_id').leftJoin('users as u', 'u.id', 'r.created_by');
}

/** Runs of one claim, oldest first. The caller has already checked the claim is the user's to see. */
export async function listLoadTestRuns(claimId: string, q: Knex = db()): Promise<LoadTestRun[]> {
  return base(q).select(columns).where('r.claim_id', claimId).orderBy([{ column: 'r.created_at' }, { column: 'r.id' }]);
}

export async function findLoadTestRun(claimId: string, id: string, q: Knex = db()): Promise<LoadTestRun | null> {
  return (await base(q).select(columns).where({ 'r.claim_id': claimId, 'r.id': id }).first()) ?? null;
}

/** Before-tests that analysed: what the evidence summary counts. */
/** Runs that analysed, judged against the given part (a run judged for another part does not count). */
export async function countAnalysedRuns(claimId: string, phase: LoadTestPhase, q: Knex = db(), partNumber?: string | null): Promise<number> {
  const query = q('load_test_runs').where({ claim_id: claimId, phase });
  if (partNumber) query.whereRaw(`spec->>'partNumber' = ?`, [partNumber]);
  const r = await query.count<{ n: string }[]>('id as n').first();
  return Number(r?.n ?? 0);
}

export async function insertLoadTestRun(
  trx: Knex,
  r: {
    id: string; claimId: string; attachmentId: string; phase: LoadTestPhase; kind: LoadTestKind; headerSignature: string;
    columnMapping: ColumnMapping; mappingSource: MappingSource; conditions: LoadTestConditionsSi; summary: LoadTestSummary;
    warnings: unknown[]; spec: LoadTestSpec; meetsSpec: boolean; sampleCount: number; createdBy: string;
  },
): Promise<void> {
  await trx('load_test_runs').insert({
    id: r.id, claim_id: r.claimId, attachment_id: r.attachmentId, phase: r.phase, kind: r.kind, header_signature: r.headerSignature,
    column_mapping: JSON.stringify(r.columnMapping), mapping_source: r.mappingSource, conditions: JSON.stringify(r.conditions),
    summary: JSON.stringify(r.summary), warnings: JSON.stringify(r.warnings), spec: JSON.stringify(r.spec), meets_spec: r.meetsSpec,
    sample_count: r.sampleCount, created_by: r.createdBy,
  });
}

export type SavedMapping = { mapping: ColumnMapping; headers: string[]; updatedAt: Date };

export async function findSavedMapping(dealerId: string, kind: LoadTestKind, signature: string, q: Knex = db()): Promise<SavedMapping | null> {
  return (
    (await q('load_test_mappings')
      .select('mapping', 'headers', 'updated_at as updatedAt')
      .where({ dealer_id: dealerId, kind, header_signature: signature })
      .first()) ?? null
  );
}

export async function saveMapping(
  trx: Knex,
  m: { dealerId: string; kind: LoadTestKind; signature: string; headers: readonly string[]; mapping: ColumnMapping; userId: string },
): Promise<void> {
  await trx('load_test_mappings')
    .insert({
      dealer_id: m.dealerId, kind: m.kind, header_signature: m.signature, headers: JSON.stringify(m.headers),
      mapping: JSON.stringify(m.mapping), updated_by: m.userId, updated_at: trx.fn.now(),
    })
    .onConflict(['dealer_id', 'kind', 'header_signature'])
    .merge(['headers', 'mapping', 'updated_by', 'updated_at']);
}

/** Locks an upload ticket while its file is recorded, so a repeated request cannot record it twice. */
export async function lockUploadIntent(trx: Knex, id: string): Promise<boolean> {
  return !!(await trx('upload_intents').where({ id }).forUpdate().first('id'));
}

/** Whether an after-test was already sent with a fitted or new-after-test step of this claim. */
export async function afterTestAlreadySent(trx: Knex, claimId: string, runId: string): Promise<boolean> {
  return !!(await trx('claim_events')
    .where({ claim_id: claimId })
    .whereIn('event', ['MARK_FITTED', 'SUBMIT_AFTER_TEST'])
    .whereRaw(`payload->>'afterTestId' = ?`, [runId])
    .first('id'));
}

/** Runs sent with a fitted or new-after-test step, by run id. */
export async function sentAfterTestIds(claimId: string, q: Knex = db()): Promise<Set<string>> {
  const rows = await q('claim_events')
    .where({ claim_id: claimId })
    .whereIn('event', ['MARK_FITTED', 'SUBMIT_AFTER_TEST'])
    .select(q.raw(`payload->>'afterTestId' as id`));
  return new Set(rows.map((r: { id: string }) => r.id));
}
