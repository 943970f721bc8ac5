import 'server-only';
import { cookies } from 'next/headers';
import { NextResponse, type NextRequest } from 'next/server';
import { ZodError, z } from 'zod';
import { currentActor } from '@/lib/auth/current-actor';
import { refuseUntilOwnPassword } from '@/lib/auth/own-password';
import { requireRole, type Actor } from '@/lib/auth/roles';
import type { Role } from '@/lib/domain/roles';
import { SESSION_COOKIE } from '@/lib/auth/session-config';
import { readSealedSession } from '@/lib/auth/session-read';
import { renewedSessionCookie } from '@/lib/auth/session-renewal';
import {
  DATABASE_UNAVAILABLE_MESSAGE,
  isDatabaseUnavailable,
  isStorageFull,
  STORAGE_FULL_MESSAGE,
} from '@/lib/database-unavailable';
import { env } from '@/lib/env';
import { AppError, isAppError } from '@/lib/errors';

type RouteContext<Params> = { params: Promise<Params> };
type Handler<Params> = (
  request: NextRequest,
  actor: Actor,
  context: RouteContext<Params>,
) => Promise<Response>;

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Route handlers have no CSRF check of their own: a changing request must come from our own origin. */
function checkOrigin(request: NextRequest): void {
  if (SAFE_METHODS.has(request.method)) return;
  const origin = request.headers.get('origin');
  const allowed = new Set([new URL(env().APP_URL).origin, request.nextUrl.origin]);
  if (!origin || !allowed.has(origin)) {
    throw new AppError(
      'forbidden',
      'This request did not come from a Gatewell page (Origin header missing or foreign).',
    );
  }
}

/**
 * Moves the session's idle clock on a signed-in read, at most once a minute, as the proxy does for pages
 * (API routes do not pass through the proxy). Changing requests leave the cookie alone.
 */
async function renewSession(request: NextRequest): Promise<void> {
  const renewed = await renewedSessionCookie(
    await readSealedSession(request.cookies.get(SESSION_COOKIE)?.value),
  );
  if (renewed) (await cookies()).set(renewed.name, renewed.value, renewed.options);
}

/** Maps an error to a JSON answer: zod → 422, AppError → its status, a lost database → a logged 503, a full disk → a logged 507, anything else → a logged 500. */
export function errorResponse(error: unknown): NextResponse {
  if (error instanceof ZodError) {
    return NextResponse.json(
      { error: 'invalid', message: 'The request is not valid.', fields: z.flattenError(error).fieldErrors },
      { status: 422 },
    );
  }
  if (isAppError(error)) {
    return NextResponse.json(
      { error: error.code, message: error.message, details: error.details ?? undefined },
      { status: error.status },
    );
  }
  if (isDatabaseUnavailable(error)) {
    console.error('database unavailable during a route', error);
    return NextResponse.json(
      { error: 'unavailable', message: DATABASE_UNAVAILABLE_MESSAGE },
      { status: 503 },
    );
  }
  if (isStorageFull(error)) {
    console.error('storage full during a route', error);
    return NextResponse.json({ error: 'storage_full', message: STORAGE_FULL_MESSAGE }, { status: 507 });
  }
  console.error('unhandled route error', error);
  return NextResponse.json(
    { error: 'internal', message: 'Something failed on the server; nothing was changed.' },
    { status: 500 },
  );
}

/**
 * Wraps a route handler: checks the Origin of changing requests, loads the signed-in actor (401 when
 * there is none), checks roles (403), and maps errors in one place.
 */
export function withUser<Params = Record<string, never>>(
  handler: Handler<Params>,
  options: {
    roles?: readonly Role[];
    /**
     * A read the page makes on its own (the bell's count on a timer), not the person: it leaves the
     * session's idle clock where it was, so that an open tab nobody uses still ends its session.
     */
    background?: boolean;
  } = {},
) {
  return async (request: NextRequest, context: RouteContext<Params>): Promise<Response> => {
    try {
      checkOrigin(request);
      const actor = await currentActor();
      if (!actor) throw new AppError('unauthorized', 'Sign in first.');
      refuseUntilOwnPassword(actor);
      if (options.roles?.length) requireRole(actor, ...options.roles);
      const response = await handler(request, actor, context);
      if (request.method === 'GET' && !options.background) await renewSession(request);
      return response;
    } catch (error) {
      return errorResponse(error);
    }
  };
}
