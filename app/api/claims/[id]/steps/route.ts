import { apiRoute, jsonBody } from '@/lib/http/api';
import { runStepRequest } from '@/lib/services/step-handlers';
import { claimIdSchema } from '@/lib/validation/claims';

export const POST = apiRoute<{ id: string }>('any', async ({ user, req, params }) =>
  runStepRequest(user, claimIdSchema.parse(params.id), await jsonBody(req)),
);
