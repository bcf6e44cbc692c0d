import { apiRoute } from '@/lib/http/api';
import { creditQueue } from '@/lib/services/credits';
import { queueQuerySchema } from '@/lib/validation/credits';

export const GET = apiRoute(['accountant'], async ({ user, req }) =>
  creditQueue(user, queueQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams))),
);
