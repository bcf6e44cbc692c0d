import { z } from 'zod';
import { apiRoute } from '@/lib/http/api';
import { completeUpload } from '@/lib/services/evidence';
import { claimIdSchema } from '@/lib/validation/claims';

export const POST = apiRoute<{ id: string; intentId: string }>(['dealer', 'dealer_admin', 'brand_rep', 'warehouse'], async ({ user, params }) =>
  completeUpload(user, claimIdSchema.parse(params.id), z.uuid().parse(params.intentId)),
);
