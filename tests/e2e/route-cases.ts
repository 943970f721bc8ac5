// The expected answer of every page and API route for an anonymous visitor and for each role.
// route-matrix.spec.ts fails when a route exists without a row here, or a row names no route.

export const SUBJECTS = ['anonymous', 'chemist', 'biologist', 'approver', 'admin'] as const;
export type Subject = (typeof SUBJECTS)[number];
type Role = Exclude<Subject, 'anonymous'>;

/** 200, a status, a redirect to sign-in or home, or "passes" (a changing request got past sign-in and roles). */
export type Outcome = 200 | 401 | 403 | 404 | 'sign-in' | 'home' | 'passes';

export interface RouteCase {
  route: string;
  expect: Record<Subject, Outcome>;
}

const ROLES: Role[] = ['chemist', 'biologist', 'approver', 'admin'];
const each = (pick: (role: Role) => Outcome) =>
  Object.fromEntries(ROLES.map((role) => [role, pick(role)])) as Record<Role, Outcome>;

/** A signed-in page; roles outside `only` get 403. */
const page = (route: string, only?: Role[], allowed: Outcome = 200): RouteCase => ({
  route: `PAGE ${route}`,
  expect: { anonymous: 'sign-in', ...each((role) => (!only || only.includes(role) ? allowed : 403)) },
});

/** An API route behind withUser: 401 without a session, 403 outside `only`. */
const api = (route: string, only?: Role[], allowed: Outcome = 200): RouteCase => ({
  route,
  expect: { anonymous: 401, ...each((role) => (!only || only.includes(role) ? allowed : 403)) },
});

export const ROUTE_CASES: RouteCase[] = [
  { route: 'PAGE /sign-in', expect: { anonymous: 200, ...each(() => 'home') } },
  // Open to anyone: asking for a password link, and the page a link opens (here with a token that is none).
  { route: 'PAGE /lost-password', expect: { anonymous: 200, ...each(() => 200) } },
  { route: 'PAGE /password-link/[token]', expect: { anonymous: 200, ...each(() => 200) } },
  { route: 'GET /api/health', expect: { anonymous: 200, ...each(() => 200) } },
  page('/'),
  page('/account'),
  page('/plates'),
  page('/plates/import', ['biologist']),
  page('/plates/[plateId]'),
  page('/plates/[plateId]/fits'),
  page('/plates/[plateId]/forecast'),
  page('/plates/[plateId]/history'),
  page('/compounds'),
  page('/compounds/[compoundId]'),
  page('/compounds/[compoundId]/profile'),
  page('/screens'),
  page('/screens/[screenId]'),
  page('/screens/new', ['admin']),
  page('/admin/users', ['admin']),
  page('/admin/users/new', ['admin']),
  page('/admin/users/[userId]', ['admin']),
  page('/admin/outbox', ['admin']),
  page('/audit', ['admin', 'approver']),
  api('GET /api/audit', ['admin', 'approver']),
  api('GET /api/audit/export', ['admin', 'approver']),
  api('GET /api/import-templates'),
  api('GET /api/compounds/[compoundId]/export', undefined, 'passes'),
  api('GET /api/compounds/[compoundId]/forecast', undefined, 'passes'),
  api('GET /api/plates/[plateId]/export', undefined, 'passes'),
  api('GET /api/plates/[plateId]/fits'),
  api('GET /api/plates/[plateId]/forecast', undefined, 'passes'),
  api('GET /api/plates/[plateId]/jobs'),
  api('GET /api/plates/[plateId]/wells'),
  api('POST /api/compounds/bulk', ['chemist', 'admin'], 'passes'),
  api('POST /api/imports/inspect', ['biologist'], 'passes'),
  api('POST /api/imports/preview', ['biologist'], 'passes'),
  api('POST /api/imports/commit', ['biologist'], 'passes'),
  api('POST /api/imports/plate', ['biologist'], 'passes'),
  api('POST /api/imports/wait', ['biologist'], 'passes'),
  api('POST /api/imports/discard', ['biologist'], 'passes'),
  api('POST /api/imports/unknown-compounds', ['chemist', 'admin'], 'passes'),
  api('POST /api/import-templates', ['biologist'], 'passes'),
  api('DELETE /api/import-templates/[templateId]', ['biologist'], 'passes'),
  api('POST /api/plates/[plateId]/exclusions', ['biologist'], 'passes'),
  api('POST /api/plates/[plateId]/fit-model', ['biologist'], 'passes'),
  api('POST /api/plates/[plateId]/jobs', undefined, 'passes'),
];
