import { NextResponse, type NextRequest } from 'next/server';

// Redirects only: a visitor with no session cookie at all goes to sign-in first. Whether a cookie is
// valid, and what its owner may do, every page, handler and action checks for itself.
export function proxy(request: NextRequest) {
  const hasSession = request.cookies.has('next-auth.session-token') || request.cookies.has('__Secure-next-auth.session-token');
  if (hasSession) return NextResponse.next();
  const signIn = new URL('/sign-in', request.url);
  signIn.searchParams.set('callbackUrl', `${request.nextUrl.pathname}${request.nextUrl.search}`);
  return NextResponse.redirect(signIn);
}

export const config = { matcher: ['/workshop/:path*', '/account/:path*'] };
