import type { SessionOptions } from 'iron-session';

/** What the sealed cookie holds: who, which credential generation, and when. */
export interface SessionData {
  userId?: string;
  sessionVersion?: number;
  issuedAt?: number;
  lastSeenAt?: number;
}

export const SESSION_COOKIE = 'gatewell_session';
/** Idle timeout: 30 minutes without a request ends the session (common practice, no source). */
export const IDLE_TIMEOUT_MS = 30 * 60 * 1000;
/** Absolute lifetime: 12 hours after sign-in (common practice, no source). */
export const ABSOLUTE_TIMEOUT_MS = 12 * 60 * 60 * 1000;

// No 'server-only' here: the proxy reads the same settings. The secret is checked for length here too.
export function sessionOptions(): SessionOptions {
  const password = process.env.SESSION_SECRET ?? '';
  if (password.length < 32) throw new Error('SESSION_SECRET must be at least 32 characters');
  return {
    password,
    cookieName: SESSION_COOKIE,
    ttl: ABSOLUTE_TIMEOUT_MS / 1000,
    cookieOptions: {
      httpOnly: true,
      sameSite: 'lax',
      secure: process.env.NODE_ENV === 'production' && process.env.SESSION_COOKIE_SECURE !== 'false',
      path: '/',
    },
  };
}

/** True while a session is inside both its idle and its absolute lifetime. */
export function sessionIsFresh(session: SessionData, now = Date.now()): boolean {
  if (!session.userId || !session.issuedAt || !session.lastSeenAt) return false;
  return now - session.issuedAt < ABSOLUTE_TIMEOUT_MS && now - session.lastSeenAt < IDLE_TIMEOUT_MS;
}
