import { sealData } from 'iron-session';
import { sessionIsFresh, sessionOptions, type SessionData } from './session-config';

// No 'server-only' here: the proxy renews page requests' cookies and withUser those of API reads.

/** A session cookie is sealed again at most once a minute (each renewal is one seal and one Set-Cookie). */
export const RENEW_AFTER_MS = 60_000;

export interface RenewedCookie {
  name: string;
  value: string;
  options: NonNullable<ReturnType<typeof sessionOptions>['cookieOptions']> & { maxAge: number };
}

/**
 * The session cookie with its idle clock moved to now, for a fresh session whose clock was last moved
 * a minute or more ago; null otherwise (nothing to renew, or too soon).
 */
export async function renewedSessionCookie(
  session: SessionData,
  now = Date.now(),
): Promise<RenewedCookie | null> {
  if (!sessionIsFresh(session, now) || now - (session.lastSeenAt ?? 0) < RENEW_AFTER_MS) return null;
  const options = sessionOptions();
  const value = await sealData(
    { ...session, lastSeenAt: now },
    { password: options.password, ttl: options.ttl ?? 0 },
  );
  return {
    name: options.cookieName,
    value,
    options: { ...options.cookieOptions, maxAge: (options.ttl ?? 0) - 60 },
  };
}
