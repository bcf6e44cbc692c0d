import { NextResponse } from 'next/server';
import { z } from 'zod';
import { apiRoute, jsonBody } from '@/lib/http/api';
import { chooseMemoForLine } from '@/lib/services/reconciliation';
import { chooseMemoSchema } from '@/lib/validation/credits';

export const POST = apiRoute<{ id: string }>(['accountant'], async ({ user, req, params }) => {
  const id = z.uuid('Unknown statement line.').parse(params.id);
  const { memoNumber } = chooseMemoSchema.parse(await jsonBody(req));
  return NextResponse.json(await chooseMemoForLine(user, id, memoNumber), { status: 201 });
});
