import { NextResponse } from 'next/server';
import { apiRoute, jsonBody } from '@/lib/http/api';
import { requestUpload } from '@/lib/services/evidence';
import { claimIdSchema } from '@/lib/validation/claims';
import { uploadRequestSchema } from '@/lib/validation/uploads';

export const POST = apiRoute<{ id: string }>(['dealer', 'dealer_admin', 'brand_rep', 'warehouse'], async ({ user, req, params }) => {
  const ticket = await requestUpload(user, claimIdSchema.parse(params.id), uploadRequestSchema.parse(await jsonBody(req)));
  return NextResponse.json(ticket, { status: 201 });
});
