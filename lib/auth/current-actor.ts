import 'server-only';
import { cookies } from 'next/headers';
import { redirect } from 'next/navigation';
import { cache } from 'react';
import { loadActor } from './load-actor';
import type { Actor } from './roles';
import { requestAddress } from './request-address';
import { SESSION_COOKIE, sessionIsFresh } from './session-config';
import { readSealedSession } from './session-read';

export { loadActor };

/**
 * The signed-in actor of this request, or null when the session is missing, expired, belongs to a
 * disabled user, or predates a password change (session_version moved on).
 */
export const currentActor = cache(async (): Promise<Actor | null> => {
  const session = await readSealedSession((await cookies()).get(SESSION_COOKIE)?.value);
  if (!sessionIsFresh(session)) return null;
  const actor = await loadActor(session.userId!, await requestAddress());
  if (!actor || actor.sessionVersion !== session.sessionVersion) return null;
  const { sessionVersion: _version, ...rest } = actor;
  return rest;
});

/** For pages: the actor, or a redirect to sign-in. */
export async function requireActor(): Promise<Actor> {
  const actor = await currentActor();
  if (!actor) redirect('/sign-in');
  return actor;
}
