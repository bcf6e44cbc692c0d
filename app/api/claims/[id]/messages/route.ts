import { NextResponse } from 'next/server';
import { DEALER_ROLES } from '@/lib/auth/roles';
import { apiRoute, jsonBody } from '@/lib/http/api';
import { postMessage } from '@/lib/services/review';
import { claimIdSchema } from '@/lib/validation/claims';
import { claimMessageSchema } from '@/lib/validation/review';

/** A message in the claim's thread (the dealer's people and the brand's reps). */
export const POST = apiRoute<{ id: string }>([...DEALER_ROLES, 'brand_rep'], async ({ user, req, params }) => {
  const id = claimIdSchema.parse(params.id);
  const input = claimMessageSchema.parse(await jsonBody(req));
  const result = await postMessage(user, id, input);
  return NextResponse.json(result, { status: result.duplicate ? 200 : 201 });
});
