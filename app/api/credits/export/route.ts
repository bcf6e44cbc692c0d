import { z } from 'zod';
import { apiRoute } from '@/lib/http/api';
import { dealerExport } from '@/lib/services/dealer-credits';

/** One brand's memos for the shop's books, in the LP-MEMO-LINES-1 layout. */
export const GET = apiRoute(['dealer_admin'], async ({ user, req }) => {
  const brandId = z.uuid('Choose a brand.').parse(new URL(req.url).searchParams.get('brand'));
  const { csv, brandName } = await dealerExport(user, brandId);
  const slug = brandName.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '');
  return new Response(csv, { headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="credits-${slug}.csv"` } });
});
