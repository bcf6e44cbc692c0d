import { NextResponse } from 'next/server';
import { apiRoute, jsonBody } from '@/lib/http/api';
import type { ColumnMapping } from '@/lib/loadtest';
import { addLoadTest } from '@/lib/services/load-tests';
import { claimIdSchema } from '@/lib/validation/claims';
import { loadTestRequestSchema } from '@/lib/validation/load-tests';

/** Records an uploaded load-test file with its conditions and analysis (201), or asks which column is what (200). */
export const POST = apiRoute<{ id: string }>(['dealer', 'dealer_admin'], async ({ user, req, params }) => {
  const body = loadTestRequestSchema.parse(await jsonBody(req));
  const result = await addLoadTest(user, claimIdSchema.parse(params.id), { ...body, mapping: (body.mapping ?? null) as ColumnMapping | null });
  return NextResponse.json(result, { status: result.status === 'stored' ? 201 : 200 });
});
