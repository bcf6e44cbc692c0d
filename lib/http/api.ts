import 'server-only';
import { randomUUID } from 'node:crypto';
import { NextResponse } from 'next/server';
import { z } from 'zod';
import { currentUser } from '@/lib/auth/session';
import type { Role } from '@/lib/auth/roles';
import type { AppUser } from '@/lib/db/users';
import { AppError } from '@/lib/errors';
import { fieldErrorsOf } from '@/lib/validation/field-errors';

type Ctx<P> = { user: AppUser; req: Request; params: P };

/**
 * Every route handler goes through here: the session is checked on the server every time,
 * then the role, then errors become the documented statuses (401, 403, 404, 409, 422, 500).
 */
export function apiRoute<P = Record<string, string>>(
  roles: readonly Role[] | 'any',
  fn: (ctx: Ctx<P>) => Promise<Response | unknown>,
) {
  return async (req: Request, context: { params: Promise<P> }) => {
    try {
      const user = await currentUser();
      if (!user) return NextResponse.json({ error: 'Sign in first.' }, { status: 401 });
      if (roles !== 'any' && !roles.includes(user.role)) {
        return NextResponse.json({ error: 'Your role cannot use this.' }, { status: 403 });
      }
      const params = (await context?.params) ?? ({} as P);
      const result = await fn({ user, req, params });
      return result instanceof Response ? result : NextResponse.json(result);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

export function errorResponse(err: unknown): Response {
  if (err instanceof z.ZodError) {
    return NextResponse.json({ error: 'Some fields need attention.', fieldErrors: fieldErrorsOf(err) }, { status: 422 });
  }
  if (err instanceof AppError) {
    return NextResponse.json({ error: err.message, ...err.details }, { status: err.status });
  }
  const requestId = randomUUID();
  console.error(`[${requestId}]`, err);
  return NextResponse.json({ error: 'Something went wrong on our side.', requestId }, { status: 500 });
}

export async function jsonBody(req: Request): Promise<unknown> {
  try {
    return await req.json();
  } catch {
    throw new AppError('The request body is not valid JSON.', 400);
  }
}
