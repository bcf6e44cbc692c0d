import { NextResponse } from 'next/server';
import { apiRoute, jsonBody } from '@/lib/http/api';
import { importStatement } from '@/lib/services/reconciliation';
import { importStatementSchema } from '@/lib/validation/credits';

export const POST = apiRoute(['accountant'], async ({ user, req }) => {
  const input = importStatementSchema.parse(await jsonBody(req));
  return NextResponse.json(await importStatement(user, input), { status: 201 });
});
