import 'server-only';
import { z } from 'zod';
import type { AppUser } from '@/lib/db/users';
import { ForbiddenError, ValidationError } from '@/lib/errors';
import type { StepOutcome } from '@/lib/services/claim-steps';
import { submitClaim, withdrawClaim } from '@/lib/services/claims';
import { inspectCore, issueReturnLabel, markCoreShipped, receiveCore, shipReplacement, waiveCore } from '@/lib/services/fulfilment';
import { acceptAfterTestByHand, markFitted, submitAfterTest } from '@/lib/services/load-tests';
import { appealClaim, approveClaim, denyClaim, releaseClaim, requestInfo, resubmitClaim, takeClaim } from '@/lib/services/review';
import { acceptByHandSchema, afterTestStepSchema } from '@/lib/validation/load-tests';
import { appealSchema, approveRequestSchema, denySchema, requestInfoSchema, resubmitSchema } from '@/lib/validation/review';
import { CLAIM_EVENT_TYPES, EVENT_RULES, type ClaimEventType } from '@/machines/claim';
import { issueCredit } from '@/lib/services/credits';

export const stepRequestSchema = z.looseObject({
  type: z.enum(CLAIM_EVENT_TYPES as unknown as [ClaimEventType, ...ClaimEventType[]], { message: 'Unknown step.' }),
  version: z.number().int().min(0).optional(),
});

type Handler = (user: AppUser, claimId: string, body: Record<string, unknown>, version?: number) => Promise<StepOutcome>;

const note = z.object({ note: z.string().trim().max(1000).optional() });

/**
 * Steps a user may ask for over HTTP, each with the server work it needs. A type missing
 * here is one the server sends itself (or one a later screen adds).
 */
export const stepHandlers: Partial<Record<ClaimEventType, Handler>> = {
  SUBMIT: (user, id, _body, version) => submitClaim(user, id, version),
  WITHDRAW: (user, id, body, version) => withdrawClaim(user, id, note.parse(body).note, version),
  SHIP: (user, id, body) => shipReplacement(user, id, body),
  ISSUE_RETURN_LABEL: (user, id, body) => issueReturnLabel(user, id, body),
  CORE_SHIPPED: (user, id, body) => markCoreShipped(user, id, body),
  CORE_RECEIVED: (user, id, body) => receiveCore(user, id, body),
  INSPECT: (user, id, body) => inspectCore(user, id, body),
  WAIVE_CORE: (user, id, body) => waiveCore(user, id, body),
  // Whether the after-test passes is read from its stored analysis; the body only names the run.
  MARK_FITTED: (user, id, body, version) => markFitted(user, id, afterTestStepSchema.parse(body).afterTestId, version),
  SUBMIT_AFTER_TEST: (user, id, body, version) => submitAfterTest(user, id, afterTestStepSchema.parse(body).afterTestId, version),
  ACCEPT_BY_HAND: (user, id, body, version) => acceptAfterTestByHand(user, id, acceptByHandSchema.parse(body).reason, version),
  // Review (brand reps) and the dealer's answers; each body is checked by its schema (422) before the step.
  TAKE: (user, id, _body, version) => takeClaim(user, id, version),
  RELEASE: (user, id, body, version) => releaseClaim(user, id, note.parse(body).note, version),
  REQUEST_INFO: (user, id, body, version) => requestInfo(user, id, requestInfoSchema.parse(body), version),
  RESUBMIT: (user, id, body, version) => resubmitClaim(user, id, resubmitSchema.parse(body).message || undefined, version),
  APPROVE: (user, id, body, version) => approveClaim(user, id, approveRequestSchema.parse(body), version),
  DENY: (user, id, body, version) => denyClaim(user, id, denySchema.parse(body), version),
  APPEAL: (user, id, body, version) => appealClaim(user, id, appealSchema.parse(body).message, version),
  // The memo is issued exactly as the accountant saw it; RECONCILE runs when a statement match is confirmed.
  ISSUE_CREDIT: (user, id, body, version) => issueCredit(user, id, z.object({ draftHash: z.string() }).parse(body).draftHash, version),
};

export async function runStepRequest(user: AppUser, claimId: string, body: unknown): Promise<StepOutcome> {
  const parsed = stepRequestSchema.parse(body);
  const handler = stepHandlers[parsed.type];
  if (!handler) throw new ValidationError(`“${parsed.type}” is not a step you can take here.`, { type: ['Not available.'] });
  // A role that may never take this step is told so before its form is judged.
  const rule = EVENT_RULES[parsed.type];
  if (!(rule.roles as readonly string[]).includes(user.role)) throw new ForbiddenError(`Only ${rule.who} can ${rule.does}.`);
  return handler(user, claimId, parsed, parsed.version);
}
