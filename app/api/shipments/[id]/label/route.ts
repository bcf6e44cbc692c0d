import { z } from 'zod';
import { apiRoute } from '@/lib/http/api';
import { labelFor } from '@/lib/services/documents';

export const GET = apiRoute<{ id: string }>(['warehouse', 'brand_rep', 'dealer', 'dealer_admin'], async ({ user, params }) => {
  const { fileName, pdf } = await labelFor(user, z.uuid('Unknown label.').parse(params.id));
  return new Response(new Uint8Array(pdf), {
    headers: { 'content-type': 'application/pdf', 'content-disposition': `inline; filename="${fileName}"`, 'cache-control': 'private, no-store' },
  });
});
