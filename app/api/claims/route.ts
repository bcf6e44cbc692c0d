import { NextResponse } from 'next/server';
import { DEALER_ROLES } from '@/lib/auth/roles';
import { listClaims } from '@/lib/db/claim-list';
import { apiRoute, jsonBody } from '@/lib/http/api';
import { createDraft } from '@/lib/services/claims';
import { claimDraftSchema, claimListQuerySchema } from '@/lib/validation/claims';

export const GET = apiRoute('any', async ({ user, req }) => {
  const query = claimListQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return listClaims(user, query);
});

export const POST = apiRoute(DEALER_ROLES, async ({ user, req }) => {
  const input = claimDraftSchema.parse(await jsonBody(req));
  return NextResponse.json(await createDraft(user, input), { status: 201 });
});
