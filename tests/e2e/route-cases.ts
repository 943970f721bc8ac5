import { randomUUID } from 'node:crypto';

// The expected answer of every entry point (page, route handler method, server action) for each actor.
// route-matrix.spec.ts fails when an entry point exists without a row here, or a row names none.
// Expectations follow the roles of DESIGN.md and lib/domain/roles.ts (CAPABILITIES), not the app's answers.

/**
 * Who knocks: an anonymous visitor; a session that has ended (its account signed out elsewhere: the cookie
 * still unseals, so the proxy lets it by and only the entry point's own check refuses it); a signed-in
 * account holding no role (a reader of results); an admin account whose password an admin set, before
 * its owner chose their own (only the Account page and its password change are open); and each role.
 */
export const SUBJECTS = [
  'anonymous',
  'ended',
  'no-role',
  'first-sign-in',
  'chemist',
  'biologist',
  'approver',
  'admin',
] as const;
export type Subject = (typeof SUBJECTS)[number];
type Role = 'chemist' | 'biologist' | 'approver' | 'admin';
type Reader = Exclude<Subject, 'anonymous' | 'ended' | 'first-sign-in'>;

/**
 * 200 (let in), 401 (no session), 403 (refused for the role, or until the person chooses their own
 * password), a redirect to sign-in, home or the Account page. For a server action, 401 and 403 are its
 * answers "Your session has ended" and "This needs the … role" or "choose your own [password]" (actions
 * answer a form state, not a status), 200 is any other answer of the action.
 */
export type Outcome = 200 | 401 | 403 | 'sign-in' | 'home' | 'account';

/** The tables an entry point writes: counted before and after each refused call (with audit_events). */
export type Table =
  | 'audit_events'
  | 'batches'
  | 'compound_aliases'
  | 'compounds'
  | 'compute_jobs'
  | 'fits'
  | 'forecasts'
  | 'import_drafts'
  | 'import_templates'
  | 'import_uploads'
  | 'login_attempts'
  | 'mail_outbox'
  | 'notice_delivery'
  | 'notices'
  | 'password_links'
  | 'plates'
  | 'screens'
  | 'signatures'
  | 'signoff_events'
  | 'targets'
  | 'user_roles'
  | 'user_grid_layouts'
  | 'users';

/** Real records of the demo data (and the matrix's own accounts) that valid requests name. */
export interface Ids {
  plateId: string;
  wellId: string;
  fitCompoundId: string;
  fitTargetId: string;
  compoundId: string;
  compoundIdentifier: string;
  screenId: string;
  screenName: string;
  templateId: string;
  userId: string;
  /** A grid whose layout a person keeps (lib/domain/grid-layouts.ts). */
  grid: string;
  /** The no-role account's e-mail and password (for sign-in and signatures). */
  readerEmail: string;
  password: string;
}

export interface Upload {
  name: string;
  mimeType: string;
  buffer: Buffer;
}

/** What a refused call sends: a request the entry point would act on, so that a missing check would write. */
export type Body = { json: unknown } | { multipart: Record<string, string | Upload> };

export interface RouteCase {
  /** "PAGE /path" or "METHOD /path", [params] kept. */
  route: string;
  expect: Record<Subject, Outcome>;
  writes?: Table[];
  body?: (ids: Ids, file: () => Upload) => Body;
  /**
   * The exact status of a call that is let in (a reader whose outcome is 200, sending no body), where the
   * row says it; otherwise a let-in call need only get past sign-in and the role check.
   */
  letIn?: number;
}

export interface ActionCase {
  /** "file#exportedName" of the 'use server' module. */
  action: string;
  expect: Record<Subject, Outcome>;
  /** The form a refused call sends: one the action would act on. */
  form: (ids: Ids) => Record<string, string>;
  writes: Table[];
}

const READERS: Reader[] = ['no-role', 'chemist', 'biologist', 'approver', 'admin'];
const each = (pick: (reader: Reader) => Outcome) =>
  Object.fromEntries(READERS.map((reader) => [reader, pick(reader)])) as Record<Reader, Outcome>;
const only = (roles: readonly Role[] | undefined) =>
  each((reader) => (!roles || (reader !== 'no-role' && roles.includes(reader)) ? 200 : 403));

// The roles of each piece of work, as DESIGN.md gives them (lib/domain/roles.ts must agree).
const MANAGE_USERS: Role[] = ['admin'];
const MANAGE_MAIL: Role[] = ['admin'];
const MANAGE_SCREENS: Role[] = ['admin'];
const READ_AUDIT: Role[] = ['admin', 'approver'];
const REGISTER_COMPOUNDS: Role[] = ['chemist', 'admin'];
const IMPORT_PLATES: Role[] = ['biologist'];
const REVIEW_PLATES: Role[] = ['biologist'];
/** Verify (chemist), submit and rework (biologist), approve and return (approver). */
const SIGN_OFF: Role[] = ['chemist', 'biologist', 'approver'];

/** A signed-in page; roles outside `roles` get 403. */
const page = (route: string, roles?: Role[]): RouteCase => ({
  route: `PAGE ${route}`,
  expect: {
    anonymous: 'sign-in',
    ended: 'sign-in',
    'first-sign-in': route === '/account' ? 200 : 'account',
    ...only(roles),
  },
});

/** A route handler behind withUser: 401 without a session, 403 outside `roles`. */
const api = (
  route: string,
  roles?: Role[],
  more: Pick<RouteCase, 'writes' | 'body' | 'letIn'> = {},
): RouteCase => ({
  route,
  expect: { anonymous: 401, ended: 401, 'first-sign-in': 403, ...only(roles) },
  ...more,
});

const csv = (name: string, text: string): Upload => ({
  name,
  mimeType: 'text/csv',
  buffer: Buffer.from(text, 'utf8'),
});

export const ROUTE_CASES: RouteCase[] = [
  // Open to anyone: sign-in (a signed-in person is sent home), asking for a password link, and the page a
  // link opens (here with a token that is none). A session that has ended is nobody's: sign-in shows its form.
  {
    route: 'PAGE /sign-in',
    expect: { anonymous: 200, ended: 200, 'first-sign-in': 'home', ...each(() => 'home') },
  },
  {
    route: 'PAGE /lost-password',
    expect: { anonymous: 200, ended: 200, 'first-sign-in': 200, ...each(() => 200) },
  },
  {
    route: 'PAGE /password-link/[token]',
    expect: { anonymous: 200, ended: 200, 'first-sign-in': 200, ...each(() => 200) },
  },
  {
    route: 'GET /api/health',
    expect: { anonymous: 200, ended: 200, 'first-sign-in': 200, ...each(() => 200) },
  },
  page('/'),
  page('/account'),
  page('/notices'),
  page('/plates'),
  page('/plates/import', IMPORT_PLATES),
  page('/plates/[plateId]'),
  page('/plates/[plateId]/fits'),
  page('/plates/[plateId]/forecast'),
  page('/plates/[plateId]/history'),
  page('/compounds'),
  page('/compounds/[compoundId]'),
  page('/compounds/[compoundId]/profile'),
  page('/screens'),
  page('/screens/[screenId]'),
  page('/screens/new', MANAGE_SCREENS),
  page('/admin/users', MANAGE_USERS),
  page('/admin/users/new', MANAGE_USERS),
  page('/admin/users/[userId]', MANAGE_USERS),
  page('/admin/outbox', MANAGE_MAIL),
  page('/audit', READ_AUDIT),
  api('GET /api/audit', READ_AUDIT),
  api('GET /api/audit/suggestions', READ_AUDIT),
  // Every download is audited: a refused one must not be.
  api('GET /api/audit/export', READ_AUDIT, { writes: ['audit_events'] }),
  api('GET /api/import-templates'),
  // The bell's count: each reader's own, 200 with the number; not before the person's own password.
  api('GET /api/notices/unseen', undefined, { letIn: 200 }),
  api('GET /api/compounds/[compoundId]/export', undefined, { writes: ['audit_events'] }),
  api('GET /api/compounds/[compoundId]/forecast', undefined, { writes: ['forecasts'] }),
  api('GET /api/plates/[plateId]/export', undefined, { writes: ['audit_events'] }),
  api('GET /api/plates/[plateId]/fits'),
  api('GET /api/plates/[plateId]/forecast', undefined, { writes: ['forecasts'] }),
  api('GET /api/plates/[plateId]/jobs'),
  api('GET /api/plates/[plateId]/wells'),
  api('POST /api/compounds/bulk', REGISTER_COMPOUNDS, {
    writes: ['compounds', 'batches'],
    body: () => ({
      multipart: {
        commit: 'true',
        file: csv('matrix-compounds.csv', 'identifier,name,lot\nMATRIX-BULK-1,Matrix bulk compound,L1\n'),
      },
    }),
  }),
  api('POST /api/imports/inspect', IMPORT_PLATES, {
    writes: ['import_drafts'],
    body: (ids, file) => ({ multipart: { screenId: ids.screenId, file: file() } }),
  }),
  api('POST /api/imports/preview', IMPORT_PLATES, {
    writes: ['import_drafts'],
    body: () => ({ multipart: { draftId: randomUUID(), sheet: 'Sheet1', mapping: '{}' } }),
  }),
  api('POST /api/imports/commit', IMPORT_PLATES, {
    writes: ['plates', 'import_uploads', 'import_drafts', 'compute_jobs'],
    body: (ids, file) => ({ multipart: { screenId: ids.screenId, label: 'MATRIX-COMMIT', file: file() } }),
  }),
  api('POST /api/imports/plate', IMPORT_PLATES, {
    writes: ['plates', 'import_uploads', 'import_drafts', 'compute_jobs'],
    body: (ids, file) => ({ multipart: { screen: ids.screenName, label: 'MATRIX-PLATE', file: file() } }),
  }),
  api('POST /api/imports/wait', IMPORT_PLATES, {
    writes: ['import_drafts'],
    body: () => ({ multipart: { draftId: randomUUID(), sheet: 'Sheet1', mapping: '{}' } }),
  }),
  api('POST /api/imports/discard', IMPORT_PLATES, {
    writes: ['import_drafts'],
    body: () => ({ multipart: { draftId: randomUUID() } }),
  }),
  api('POST /api/imports/unknown-compounds', REGISTER_COMPOUNDS, {
    writes: ['compounds', 'batches', 'compound_aliases'],
    body: (ids) => ({
      json: {
        register: [{ identifier: 'MATRIX-UNKNOWN-1', lot: 'L1' }],
        aliases: [{ alias: 'MATRIX-ALIAS-1', compoundIdentifier: ids.compoundIdentifier }],
      },
    }),
  }),
  api('POST /api/import-templates', IMPORT_PLATES, {
    writes: ['import_templates'],
    body: () => ({ json: { name: 'Matrix template', mapping: {}, headers: ['Well'] } }),
  }),
  api('DELETE /api/import-templates/[templateId]', IMPORT_PLATES, { writes: ['import_templates'] }),
  api('POST /api/plates/[plateId]/exclusions', REVIEW_PLATES, {
    writes: ['fits', 'compute_jobs'],
    body: (ids) => ({ json: { wellIds: [ids.wellId], excluded: true, reason: 'authorisation matrix' } }),
  }),
  api('POST /api/plates/[plateId]/fit-model', REVIEW_PLATES, {
    writes: ['fits', 'compute_jobs'],
    body: (ids) => ({ json: { compoundId: ids.fitCompoundId, targetId: ids.fitTargetId, model: 'hill4' } }),
  }),
  // A forecast run computes results from approved fits: reading results needs no role (DESIGN.md).
  api('POST /api/plates/[plateId]/jobs', undefined, { writes: ['compute_jobs'], body: () => ({ json: {} }) }),
  // A person's own grid layout: every reader keeps and resets their own, not before their own password.
  // Let in with no body, a PUT is refused as invalid (422); a DELETE answers 204, kept layout or none.
  // The refused actors each hold a layout (route-matrix.spec.ts), so a DELETE let through would show.
  api('PUT /api/grid-layouts/[grid]', undefined, {
    writes: ['user_grid_layouts'],
    body: () => ({ json: { columns: [{ id: 'position', hidden: false, width: 90 }] } }),
    letIn: 422,
  }),
  api('DELETE /api/grid-layouts/[grid]', undefined, { writes: ['user_grid_layouts'], letIn: 204 }),
];

/** A server action of a signed-in page: the proxy sends anonymous visitors to sign-in, the action refuses the rest. */
const signedInAction = (
  action: string,
  roles: Role[] | undefined,
  form: ActionCase['form'],
  writes: Table[],
): ActionCase => ({
  action,
  expect: { anonymous: 'sign-in', ended: 401, 'first-sign-in': roles ? 403 : 200, ...only(roles) },
  form,
  writes,
});

/**
 * A signed-in person's action on their own things (notices, how they are told): every role may call it,
 * but not before choosing their own password.
 */
const ownAction = (action: string, form: ActionCase['form'], writes: Table[]): ActionCase => ({
  ...signedInAction(action, undefined, form, writes),
  expect: { anonymous: 'sign-in', ended: 401, 'first-sign-in': 403, ...only(undefined) },
});

/** An action of the pages for anonymous visitors: anyone may call it. */
const openAction = (action: string, form: ActionCase['form'], writes: Table[]): ActionCase => ({
  action,
  expect: { anonymous: 200, ended: 200, 'first-sign-in': 200, ...each(() => 200) },
  form,
  writes,
});

const screenForm = (name: string): Record<string, string> => ({
  name,
  description: 'authorisation matrix',
  neuronPreset: 'pospischil-rs-2008',
  zPrimeMin: '0.5',
  sealResistanceMin_GOhm: '0.5',
  controlCurrentMin_pA: '200',
  seriesResistanceMax_MOhm: '20',
  capacitanceMin_pF: '5',
  capacitanceMax_pF: '100',
  vehicleRundownMax_percent: '20',
  exposures_uM: '1',
});

export const ACTION_CASES: ActionCase[] = [
  signedInAction(
    'app/(app)/account/actions.ts#changePasswordAction',
    undefined,
    (ids) => ({
      currentPassword: ids.password,
      newPassword: 'matrix-new-password-1',
      confirmPassword: 'matrix-new-password-1',
    }),
    ['audit_events'],
  ),
  ownAction('app/(app)/account/actions.ts#setNoticeDeliveryAction', () => ({ delivery: 'app_only' }), [
    'notice_delivery',
    'audit_events',
  ]),
  // Marking seen changes rows, adds none: nothing for the count to see; the integration test
  // (tests/integration/notices.test.ts) checks that another's notice is refused with nothing written.
  ownAction('app/(app)/notices/actions.ts#openNoticeAction', () => ({ noticeId: randomUUID() }), []),
  ownAction('app/(app)/notices/actions.ts#markNoticeSeenAction', () => ({ noticeId: randomUUID() }), []),
  ownAction(
    'app/(app)/notices/actions.ts#markAllNoticesSeenAction',
    () => ({ upTo: new Date().toISOString() }),
    [],
  ),
  signedInAction(
    'app/(app)/admin/outbox/actions.ts#requeueMailAction',
    MANAGE_MAIL,
    () => ({ messageId: randomUUID() }),
    ['mail_outbox'],
  ),
  signedInAction('app/(app)/admin/outbox/actions.ts#sendWaitingMailAction', MANAGE_MAIL, () => ({}), []),
  signedInAction(
    'app/(app)/admin/users/actions.ts#createUserAction',
    MANAGE_USERS,
    () => ({
      name: 'Matrix Intruder',
      email: 'matrix-intruder@gatewell.test',
      roles: 'admin',
      access: 'password',
    }),
    ['users', 'user_roles', 'mail_outbox', 'password_links'],
  ),
  signedInAction(
    'app/(app)/admin/users/actions.ts#changeRolesAction',
    MANAGE_USERS,
    (ids) => ({ userId: ids.userId, roles: 'admin', reason: 'authorisation matrix' }),
    ['user_roles'],
  ),
  signedInAction(
    'app/(app)/admin/users/actions.ts#setUserStatusAction',
    MANAGE_USERS,
    (ids) => ({ userId: ids.userId, status: 'disabled', reason: 'authorisation matrix' }),
    [],
  ),
  signedInAction(
    'app/(app)/admin/users/actions.ts#resetPasswordAction',
    MANAGE_USERS,
    (ids) => ({ userId: ids.userId, password: 'matrix-reset-password-1', reason: 'authorisation matrix' }),
    [],
  ),
  signedInAction(
    'app/(app)/compounds/actions.ts#createCompoundAction',
    REGISTER_COMPOUNDS,
    () => ({ identifier: 'MATRIX-NEW-1', name: 'Matrix compound' }),
    ['compounds'],
  ),
  signedInAction(
    'app/(app)/compounds/actions.ts#updateCompoundAction',
    REGISTER_COMPOUNDS,
    (ids) => ({
      compoundId: ids.compoundId,
      identifier: ids.compoundIdentifier,
      name: 'Renamed by the matrix',
    }),
    [],
  ),
  signedInAction(
    'app/(app)/compounds/actions.ts#addBatchAction',
    REGISTER_COMPOUNDS,
    (ids) => ({ compoundId: ids.compoundId, lot: 'MATRIX-LOT-1', solvent: 'DMSO' }),
    ['batches'],
  ),
  signedInAction(
    'app/(app)/plates/[plateId]/signoff/actions.ts#signPlateStepAction',
    SIGN_OFF,
    (ids) => ({ plateId: ids.plateId, action: 'verify', password: ids.password, expectedVersion: '1' }),
    ['signatures', 'signoff_events', 'mail_outbox'],
  ),
  signedInAction(
    'app/(app)/screens/actions.ts#createScreenAction',
    MANAGE_SCREENS,
    () => screenForm('Matrix screen'),
    ['screens'],
  ),
  signedInAction(
    'app/(app)/screens/actions.ts#updateScreenAction',
    MANAGE_SCREENS,
    (ids) => ({ ...screenForm(ids.screenName), screenId: ids.screenId }),
    [],
  ),
  signedInAction(
    'app/(app)/screens/actions.ts#addTargetAction',
    MANAGE_SCREENS,
    (ids) => ({ screenId: ids.screenId, name: 'Matrix target', conductance: 'gK' }),
    ['targets'],
  ),
  signedInAction(
    'app/(app)/screens/actions.ts#setTargetMappingAction',
    MANAGE_SCREENS,
    (ids) => ({
      screenId: ids.screenId,
      targetId: ids.fitTargetId,
      preset: 'wang-buzsaki-1996',
      conductance: 'gNa',
    }),
    [],
  ),
  openAction(
    'app/(auth)/lost-password/actions.ts#requestPasswordLinkAction',
    (ids) => ({ email: ids.readerEmail }),
    ['password_links', 'mail_outbox'],
  ),
  openAction(
    'app/(auth)/password-link/[token]/actions.ts#setPasswordByLinkAction',
    () => ({
      token: 'a'.repeat(43),
      newPassword: 'matrix-link-password-1',
      confirmPassword: 'matrix-link-password-1',
    }),
    ['password_links'],
  ),
  openAction(
    'app/(auth)/sign-in/actions.ts#signInAction',
    (ids) => ({ email: ids.readerEmail, password: ids.password }),
    ['login_attempts'],
  ),
  // Sign-out ends the session: it runs last for each actor, and sends everyone to sign-in.
  {
    action: 'app/(auth)/sign-in/actions.ts#signOutAction',
    expect: { anonymous: 'sign-in', ended: 'sign-in', 'first-sign-in': 'sign-in', ...each(() => 'sign-in') },
    form: () => ({}),
    writes: [],
  },
];
