import { apiRoute } from '@/lib/http/api';
import { exportBrandMemos } from '@/lib/services/accounting-reports';
import { exportQuerySchema } from '@/lib/validation/credits';

/** Memos and lines in the LP-MEMO-LINES-1 layout (lib/reports/README.md), for the accounting system. */
export const GET = apiRoute(['accountant'], async ({ user, req }) => {
  const period = exportQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const csv = await exportBrandMemos(user, period);
  const name = `credit-memos_${period.from ?? 'all'}_${period.to ?? 'all'}.csv`;
  return new Response(csv, { headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': `attachment; filename="${name}"` } });
});
