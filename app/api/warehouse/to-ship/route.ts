import { apiRoute } from '@/lib/http/api';
import { toShipPage } from '@/lib/services/warehouse';
import { toShipQuerySchema } from '@/lib/validation/fulfilment';

export const GET = apiRoute(['warehouse'], async ({ user, req }) =>
  toShipPage(user, toShipQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams))),
);
