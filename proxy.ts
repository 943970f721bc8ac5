import { NextResponse, type NextRequest } from 'next/server';
import { PATHNAME_HEADER } from '@/lib/auth/page-roles';
import { sessionIsFresh, sessionOptions, type SessionData } from '@/lib/auth/session-config';
import { readSealedSession } from '@/lib/auth/session-read';
import { renewedSessionCookie } from '@/lib/auth/session-renewal';
import { contentSecurityPolicy, newNonce, NONCE_HEADER } from '@/lib/security/content-security-policy';

// Paths that anonymous visitors may open. API routes do not come here (see the matcher below).
const PUBLIC_PREFIXES = ['/sign-in', '/lost-password', '/password-link/', '/_next/', '/favicon'];

/** Sends anonymous or expired visitors to sign-in, keeps an active session's idle clock current, and sets this answer's CSP. */
export async function proxy(request: NextRequest) {
  const { pathname, search } = request.nextUrl;
  const nonce = newNonce();
  const policy = contentSecurityPolicy(nonce);
  const options = sessionOptions();
  const sealed = request.cookies.get(options.cookieName)?.value;
  const session: SessionData = await readSealedSession(sealed);
  const fresh = sessionIsFresh(session);

  if (!fresh && !PUBLIC_PREFIXES.some((prefix) => pathname.startsWith(prefix))) {
    const url = request.nextUrl.clone();
    url.pathname = '/sign-in';
    url.search = pathname === '/' ? '' : `?next=${encodeURIComponent(pathname + search)}`;
    const response = NextResponse.redirect(url);
    response.headers.set('Content-Security-Policy', policy);
    if (sealed) response.cookies.delete(options.cookieName);
    return response;
  }

  // The signed-in layout checks page roles before streaming starts, so it needs the path (set here, never trusted from the client).
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set(PATHNAME_HEADER, pathname);
  // Next reads the policy on the request to put the nonce on its own scripts; the root layout reads the nonce for style tags.
  requestHeaders.set(NONCE_HEADER, nonce);
  requestHeaders.set('Content-Security-Policy', policy);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set('Content-Security-Policy', policy);
  // Renewed at most once a minute (prefetches must not loop), and on reads only: a POST may be a server
  // action that writes the cookie itself (sign-out, password change), and two Set-Cookie headers for one
  // cookie in one answer leave the browser to pick either.
  if (request.method === 'GET' && !pathname.startsWith('/_next/')) {
    const renewed = await renewedSessionCookie(session);
    if (renewed) response.cookies.set(renewed.name, renewed.value, renewed.options);
  }
  return response;
}

// API routes skip the proxy: they answer 401 and check origins themselves (withUser), renew the session
// cookie on reads themselves, and their JSON needs no page policy; each request through the proxy costs
// the server some milliseconds of CPU (docs/performance.md, Session 4). The app's icons (app/icon.*,
// app/apple-icon.*, app/favicon.ico) are public files: they skip it too, so the sign-in page has them.
export const config = {
  matcher: ['/((?!api/|_next/static|_next/image|favicon.ico|icon\\.|apple-icon\\.).*)'],
};
