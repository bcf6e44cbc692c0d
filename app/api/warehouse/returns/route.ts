import { apiRoute } from '@/lib/http/api';
import { returnsPage } from '@/lib/services/warehouse';
import { returnsQuerySchema } from '@/lib/validation/fulfilment';

export const GET = apiRoute(['warehouse'], async ({ user, req }) =>
  returnsPage(user, returnsQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams))),
);
