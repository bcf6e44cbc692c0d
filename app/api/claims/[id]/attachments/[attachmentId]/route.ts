import { z } from 'zod';
import { DEALER_ROLES } from '@/lib/auth/roles';
import { apiRoute } from '@/lib/http/api';
import { removeAttachment } from '@/lib/services/evidence';
import { claimIdSchema } from '@/lib/validation/claims';

export const DELETE = apiRoute<{ id: string; attachmentId: string }>(DEALER_ROLES, async ({ user, params }) => {
  await removeAttachment(user, claimIdSchema.parse(params.id), z.uuid().parse(params.attachmentId));
  return { ok: true };
});
