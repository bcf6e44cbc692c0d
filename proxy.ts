import { NextResponse, type NextRequest } from 'next/server';

// Optimistic only: sends visitors without a session cookie to sign-in. Every page, action
// and route handler checks the session itself (lib/auth/session.ts).
const SESSION_COOKIES = ['next-auth.session-token', '__Secure-next-auth.session-token'];

export function proxy(req: NextRequest) {
  const hasSession = SESSION_COOKIES.some((c) => req.cookies.has(c));
  if (hasSession) return NextResponse.next();
  const url = new URL('/signin', req.url);
  const path = req.nextUrl.pathname + req.nextUrl.search;
  if (path !== '/') url.searchParams.set('next', path);
  return NextResponse.redirect(url);
}

export const config = {
  // Everything but sign-in, invitations, auth endpoints, other API routes (they answer 401
  // themselves) and static files.
  matcher: ['/((?!signin|invite|api/|_next/|favicon|fonts/).*)'],
};
