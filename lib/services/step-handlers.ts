import 'server-only';
import { z } from 'zod';
import type { AppUser } from '@/lib/db/users';
import { ValidationError } from '@/lib/errors';
import type { StepOutcome } from '@/lib/services/claim-steps';
import { submitClaim, withdrawClaim } from '@/lib/services/claims';
import { issueCredit } from '@/lib/services/credits';
import { CLAIM_EVENT_TYPES, type ClaimEventType } from '@/machines/claim';

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
  // The memo is issued exactly as the accountant saw it; RECONCILE runs when a statement match is confirmed.
  ISSUE_CREDIT: (user, id, body, version) => issueCredit(user, id, z.object({ draftHash: z.string() }).parse(body).draftHash, version),
};

export async function runStepRequest(user: AppUser, claimId: string, body: unknown): Promise<StepOutcome> {
  const parsed = stepRequestSchema.parse(body);
  const handler = stepHandlers[parsed.type];
  if (!handler) throw new ValidationError(`“${parsed.type}” is not a step you can take here.`, { type: ['Not available.'] });
  return handler(user, claimId, parsed, parsed.version);
}
