import 'server-only';
import { createHash, randomUUID } from 'node:crypto';
import { db } from '@/db/connection';
import { LOAD_TEST_KINDS } from '@/lib/claims/attachment-rules';
import { deleteIntent, findIntent, insertAttachment } from '@/lib/db/attachments';
import { findPart, findPolicy } from '@/lib/db/catalog';
import { findClaimForUser, type ClaimRecord } from '@/lib/db/claims';
import {
  afterTestAlreadySent,
  findLoadTestRun,
  findSavedMapping,
  insertLoadTestRun,
  lockUploadIntent,
  saveMapping,
} from '@/lib/db/load-tests';
import type { AppUser } from '@/lib/db/users';
import { AppError, ConflictError, ForbiddenError, NotFoundError, ValidationError } from '@/lib/errors';
import type { ColumnMapping, LoadtestIssue } from '@/lib/loadtest';
import {
  analyseUpload,
  conditionsFromForm,
  legalClassId,
  loadTestKindFor,
  type ConditionsForm,
  type LoadTestKind,
  type LoadTestPhase,
  type LoadTestSpec,
  type MappingSource,
} from '@/lib/loadtest-evidence';
import { applyStep, logClaimNote, type StepOutcome } from '@/lib/services/claim-steps';
import { notifyBrandRole, notifyDealer } from '@/lib/services/claim-notify';
import { assertMayAttach, arrivedBytes, sealedKeyFor } from '@/lib/services/evidence';
import { deleteObject, putObject } from '@/lib/storage/s3';
import type { UnitSystem } from '@/lib/units';

export type LoadTestRequest = {
  intentId: string;
  /** The units the conditions were typed in. */
  units: UnitSystem;
  conditions: Partial<ConditionsForm>;
  /** The dealer's answer to a mapping question for this file. */
  mapping?: ColumnMapping | null;
  /** Remember an entered mapping for this dealer's files with the same columns (default yes). */
  saveMapping?: boolean;
};

export type LoadTestAdded =
  | {
      status: 'stored';
      runId: string;
      attachmentId: string;
      phase: LoadTestPhase;
      meetsSpec: boolean;
      verdict: string;
      mappingSource: MappingSource;
      warnings: readonly LoadtestIssue[];
    }
  | {
      status: 'needs-mapping';
      intentId: string;
      kind: LoadTestKind;
      headers: readonly string[];
      guesses: readonly unknown[];
      proposedMapping: ColumnMapping;
      missing: readonly string[];
      missingOneOf: readonly string[];
      /** Why the mapping saved for these columns did not read this file, when there is one. */
      savedMappingProblem: string | null;
    };

/** 422 with the library's issues (each naming its line or column); `retryable` keeps the upload for another try. */
function refusal(message: string, issues: readonly LoadtestIssue[], warnings: readonly LoadtestIssue[], retryable: boolean): AppError {
  return new AppError(message, 422, { issues, warnings, retryable, fieldErrors: {} });
}

/** Why a load test of this phase cannot be added to the claim now; null when it can. */
function phaseProblem(claim: ClaimRecord, phase: LoadTestPhase): string | null {
  if (phase === 'before') return null;
  if (claim.stage !== 'approved') return 'An after-test is added once the claim is approved and the replacement is on the bike.';
  switch (claim.replacementStep) {
    case 'to_ship':
      return 'The replacement has not shipped yet; run the after-test once it is fitted.';
    case 'verified':
      return 'The replacement is already verified; no new after-test is needed.';
    default:
      return null;
  }
}

/** The part's yardstick, frozen with the run. Without a failed part there is nothing to hold the run to. */
async function specFor(claim: ClaimRecord, kind: LoadTestKind): Promise<LoadTestSpec> {
  if (!claim.partId) {
    throw new ValidationError('Choose the failed part in the claim’s details first, so the run can be checked against its spec.', { partId: ['Choose the failed part.'] });
  }
  const part = await findPart(claim.brandId, claim.partId);
  if (!part) throw new NotFoundError('The claim’s part is no longer in the catalog.');
  if (kind === 'battery') {
    const policy = await findPolicy(claim.brandId, 'battery');
    if (!part.ratedCapacityAh) throw new ValidationError(`The catalog has no rated capacity for ${part.partNumber}; the brand must add it before a discharge can be judged.`);
    return {
      kind: 'battery', ratedCapacityAh: part.ratedCapacityAh, nominalVoltageV: part.nominalVoltageV,
      thresholdPct: policy?.capacityThresholdPct ?? null, partNumber: part.partNumber,
    };
  }
  return {
    kind: 'dyno', minWheelPowerW: part.minWheelPowerW, minWheelTorqueNm: part.minWheelTorqueNm,
    legalClass: legalClassId(claim.legalClass), partNumber: part.partNumber,
  };
}

/**
 * Records an uploaded load-test file together with its analysis, or refuses it. The file is read on
 * the server from storage after its size and checksum are confirmed; the attachment, the analysis,
 * a remembered column mapping and the timeline note are written in one transaction, so a file that
 * fails analysis leaves nothing behind (and is removed from storage). A file that only needs its
 * columns named, or conditions that need fixing, keeps its upload ticket for another try.
 */
export async function addLoadTest(user: AppUser, claimId: string, req: LoadTestRequest): Promise<LoadTestAdded> {
  if (user.orgKind !== 'dealer') throw new ForbiddenError('Only the dealer adds load tests.');
  const claim = await findClaimForUser(user, claimId);
  if (!claim) throw new NotFoundError('No such claim.');
  const intent = await findIntent(claim.id, req.intentId, user.id);
  if (!intent) throw new NotFoundError('No such upload; add the file again.');
  if (!LOAD_TEST_KINDS.includes(intent.kind)) throw new ValidationError('This upload is not a load test.', { file: ['Not a load test.'] });
  const phase: LoadTestPhase = intent.kind === 'load_test_before' ? 'before' : 'after';

  const discard = async () => {
    await Promise.allSettled([deleteObject(intent.storageKey)]);
    await deleteIntent(intent.id);
  };
  const refuseAndDiscard = async (err: Error): Promise<never> => {
    await discard();
    throw err;
  };

  const wrongPhase = phaseProblem(claim, phase);
  if (wrongPhase) return refuseAndDiscard(new ConflictError(wrongPhase, { stage: claim.stage, replacementStep: claim.replacementStep }));
  try {
    assertMayAttach(user, claim, intent.kind);
  } catch (err) {
    return refuseAndDiscard(err as Error);
  }

  const conditions = conditionsFromForm(req.conditions, req.units);
  if (!conditions.ok) throw new ValidationError('Some test conditions need attention; the file is kept until you send them again.', conditions.fieldErrors);
  const kind = loadTestKindFor(claim.partCategory);
  const spec = await specFor(claim, kind);

  const arrived = await arrivedBytes(intent);
  if (!arrived.ok) return refuseAndDiscard(new ValidationError(arrived.message, { file: [arrived.message] }));
  const bytes = arrived.bytes;

  let mappingSource: MappingSource = req.mapping ? 'entered' : 'recognised';
  let result = analyseUpload(bytes, { kind, spec, conditions: conditions.conditions, mapping: req.mapping ?? null });
  let savedMappingProblem: string | null = null;
  if (result.status === 'needs-mapping') {
    const saved = await findSavedMapping(claim.dealerId, kind, result.signature);
    if (saved) {
      const again = analyseUpload(bytes, { kind, spec, conditions: conditions.conditions, mapping: saved.mapping });
      if (again.status === 'ok') {
        result = again;
        mappingSource = 'saved';
      } else if (again.status === 'error') {
        savedMappingProblem = `Your saved columns for this layout did not read this file: ${again.errors[0]?.message ?? 'it has other problems'}`;
      }
    }
  }

  switch (result.status) {
    case 'needs-mapping':
      return {
        status: 'needs-mapping', intentId: intent.id, kind, headers: result.headers, guesses: result.guesses,
        proposedMapping: result.proposedMapping, missing: result.missing, missingOneOf: result.missingOneOf, savedMappingProblem,
      };
    case 'conditions':
      throw new ValidationError(result.message, { [result.field]: [result.message] });
    case 'error': {
      const message = `${intent.fileName} could not be read as a ${kind === 'dyno' ? 'dyno run' : 'battery discharge'}; nothing was added.`;
      // An answer to the mapping question may be what is wrong: keep the file so it can be answered again.
      if (mappingSource === 'entered') throw refusal(message, result.errors, result.warnings, true);
      return refuseAndDiscard(refusal(message, result.errors, result.warnings, false));
    }
  }

  const analysed = result;
  const runId = randomUUID();
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  // The analysed bytes move to a key the browser never had, so the file cannot change afterwards.
  const storageKey = sealedKeyFor(intent.storageKey);
  await putObject(storageKey, bytes, 'text/csv');
  const recorded = await db().transaction(async (trx) => {
    if (!(await lockUploadIntent(trx, intent.id))) throw new ConflictError(`${intent.fileName} was added already.`);
    const locked = await findClaimForUser(user, claim.id, trx, true);
    if (!locked) throw new NotFoundError('No such claim.');
    const nowWrong = phaseProblem(locked, phase);
    if (nowWrong) throw new ConflictError(nowWrong, { stage: locked.stage, replacementStep: locked.replacementStep });
    assertMayAttach(user, locked, intent.kind);
    const attachmentId = await insertAttachment(trx, {
      claimId: claim.id, kind: intent.kind, storageKey, thumbnailKey: null, fileName: intent.fileName,
      contentType: 'text/csv', sizeBytes: bytes.length, sha256, uploadedBy: user.id,
    });
    await insertLoadTestRun(trx, {
      id: runId, claimId: claim.id, attachmentId, phase, kind, headerSignature: analysed.signature, columnMapping: analysed.columnMapping,
      mappingSource, conditions: conditions.conditions, summary: analysed.summary, warnings: [...analysed.warnings], spec,
      meetsSpec: analysed.verdict.meets, sampleCount: analysed.sampleCount, createdBy: user.id,
    });
    if (mappingSource === 'entered' && req.mapping && req.saveMapping !== false) {
      await saveMapping(trx, { dealerId: claim.dealerId, kind, signature: analysed.signature, headers: analysed.headers, mapping: req.mapping, userId: user.id });
    }
    await logClaimNote(trx, user, locked, 'EVIDENCE_ADDED', {
      attachmentId, kind: intent.kind, fileName: intent.fileName, sha256, loadTestId: runId, meetsSpec: analysed.verdict.meets,
    });
    await deleteIntent(intent.id, trx);
    return { attachmentId };
  }).catch(async (err) => {
    // A repeated request for a file already recorded must not remove the recorded file.
    await deleteObject(storageKey).catch(() => {});
    if (!(err instanceof ConflictError && /added already/.test(err.message))) await discard();
    throw err;
  });
  await deleteObject(intent.storageKey).catch(() => {});

  return {
    status: 'stored', runId, attachmentId: recorded.attachmentId, phase, meetsSpec: analysed.verdict.meets,
    verdict: analysed.verdict.message, mappingSource, warnings: analysed.warnings,
  };
}

/**
 * The fitted and new-after-test steps. Whether the after-test passes is read from the stored
 * analysis of the chosen run, inside the step's transaction; anything the browser says about it
 * is ignored.
 */
async function sendAfterTest(user: AppUser, claimId: string, type: 'MARK_FITTED' | 'SUBMIT_AFTER_TEST', runId: string, expectedVersion?: number): Promise<StepOutcome> {
  return applyStep(user, claimId, type, {}, {
    expectedVersion,
    prepare: async ({ trx, claim }) => {
      const run = await findLoadTestRun(claim.id, runId, trx);
      if (!run || run.phase !== 'after') {
        throw new ValidationError('Choose an after-test uploaded to this claim.', { afterTestId: ['No such after-test on this claim.'] });
      }
      if (await afterTestAlreadySent(trx, claim.id, run.id)) {
        throw new ConflictError('This after-test was sent already; run the test again and upload the new file.', { stage: claim.stage, version: claim.version });
      }
      return { afterTestId: run.id, afterTestPasses: run.meetsSpec };
    },
    after: async ({ trx, claim }, _next, event) => {
      const passes = event.type === type && (event as { afterTestPasses: boolean }).afterTestPasses;
      await notifyBrandRole(trx, claim, 'brand_rep', passes
        ? { kind: 'after_test_passed', title: `Claim ${claim.number}: repair verified`, body: `${claim.dealerName} fitted the replacement; the after-test meets the part’s spec.`, onlyAssigned: true }
        : { kind: 'after_test_failed', title: `Claim ${claim.number}: after-test below spec`, body: `${claim.dealerName} fitted the replacement, but the after-test does not meet the part’s spec. Accept it by hand with a reason, or wait for a new after-test.`, onlyAssigned: true });
    },
  });
}

export const markFitted = (user: AppUser, claimId: string, runId: string, version?: number) => sendAfterTest(user, claimId, 'MARK_FITTED', runId, version);
export const submitAfterTest = (user: AppUser, claimId: string, runId: string, version?: number) => sendAfterTest(user, claimId, 'SUBMIT_AFTER_TEST', runId, version);

/** The rep verifies the repair although the after-test fell short, saying why. */
export async function acceptAfterTestByHand(user: AppUser, claimId: string, reason: string, expectedVersion?: number): Promise<StepOutcome> {
  return applyStep(user, claimId, 'ACCEPT_BY_HAND', { reason }, {
    expectedVersion,
    after: async ({ trx, claim }) => {
      await notifyDealer(trx, claim, {
        kind: 'after_test_accepted',
        title: `Claim ${claim.number}: after-test accepted`,
        body: `${user.name} accepted the after-test by hand: “${reason}”`,
      });
    },
  });
}
