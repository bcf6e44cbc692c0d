import { z } from 'zod';
import { DEALER_ROLES } from '@/lib/auth/roles';
import { findClaimForUser } from '@/lib/db/claims';
import { NotFoundError } from '@/lib/errors';
import { apiRoute, jsonBody } from '@/lib/http/api';
import { updateDraft } from '@/lib/services/claims';
import { claimDraftSchema, claimIdSchema } from '@/lib/validation/claims';

export const GET = apiRoute<{ id: string }>('any', async ({ user, params }) => {
  const claim = await findClaimForUser(user, claimIdSchema.parse(params.id));
  if (!claim) throw new NotFoundError('No such claim.');
  const { context: _c, ...shown } = claim;
  return shown;
});

export const PATCH = apiRoute<{ id: string }>(DEALER_ROLES, async ({ user, req, params }) => {
  const body = (await jsonBody(req)) as Record<string, unknown>;
  const version = z.number().int().min(0).parse(body?.version);
  await updateDraft(user, claimIdSchema.parse(params.id), version, claimDraftSchema.parse(body));
  return { ok: true };
});
