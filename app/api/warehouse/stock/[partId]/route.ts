import { z } from 'zod';
import { apiRoute, jsonBody } from '@/lib/http/api';
import { adjustPartStock, setPartRestockDate } from '@/lib/services/warehouse';

const partId = z.uuid('Unknown part.');

/** An adjustment with a reason: { delta, reason, note }. */
export const POST = apiRoute<{ partId: string }>(['warehouse'], async ({ user, req, params }) =>
  adjustPartStock(user, partId.parse(params.partId), await jsonBody(req)),
);

/** The date more is expected: { expectedOn: 'YYYY-MM-DD' | '' }. */
export const PUT = apiRoute<{ partId: string }>(['warehouse'], async ({ user, req, params }) =>
  setPartRestockDate(user, partId.parse(params.partId), await jsonBody(req)),
);
