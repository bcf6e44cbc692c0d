import { NextResponse } from 'next/server';
import { z } from 'zod';
import { apiRoute } from '@/lib/http/api';
import { attachmentLink } from '@/lib/services/evidence';

// Evidence is served only through short-lived presigned links, after the claim scope check.
export const GET = apiRoute<{ id: string }>('any', async ({ user, req, params }) => {
  const url = await attachmentLink(user, z.uuid().parse(params.id), new URL(req.url).searchParams.has('thumb'));
  return NextResponse.redirect(url, { status: 302, headers: { 'Cache-Control': 'private, no-store' } });
});
