import { apiRoute } from '@/lib/http/api';
import { reviewQueue } from '@/lib/services/review-queue';
import { reviewQueueQuerySchema } from '@/lib/validation/review';

/** The brand rep's review queue: one page, filtered and sorted on the server. */
export const GET = apiRoute(['brand_rep'], async ({ user, req }) =>
  reviewQueue(user, reviewQueueQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams))),
);
