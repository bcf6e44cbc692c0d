import { apiRoute } from '@/lib/http/api';
import { packingSlipFor } from '@/lib/services/documents';
import { claimIdSchema } from '@/lib/validation/claims';

export const GET = apiRoute<{ id: string }>(['warehouse', 'brand_rep', 'dealer', 'dealer_admin'], async ({ user, params }) => {
  const { fileName, pdf } = await packingSlipFor(user, claimIdSchema.parse(params.id));
  return new Response(new Uint8Array(pdf), {
    headers: { 'content-type': 'application/pdf', 'content-disposition': `inline; filename="${fileName}"`, 'cache-control': 'private, no-store' },
  });
});
