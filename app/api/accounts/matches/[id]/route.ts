import { z } from 'zod';
import { apiRoute, jsonBody } from '@/lib/http/api';
import { confirmMatch, rejectMatch } from '@/lib/services/reconciliation';
import { matchDecisionSchema } from '@/lib/validation/credits';

export const POST = apiRoute<{ id: string }>(['accountant'], async ({ user, req, params }) => {
  const id = z.uuid('Unknown match.').parse(params.id);
  const { action, note } = matchDecisionSchema.parse(await jsonBody(req));
  if (action === 'confirm') return confirmMatch(user, id);
  await rejectMatch(user, id, note);
  return { rejected: true };
});
