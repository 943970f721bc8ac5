import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { recordAudit } from '@/lib/audit/record';
import { auditEventsForExport, auditFilterChoices, searchAudit } from '@/lib/audit/search';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { csvText } from '@/lib/exports/document';
import { auditExport } from '@/lib/exports/audit-export';
import { AuditEvent } from '@/models';
import { makeActor } from '../support/actors';
import { asSchemaOwner, resetDatabase } from '../support/database';

let admin: Actor;
let approver: Actor;

async function eventAt(
  actor: Actor | null,
  at: string,
  entityType: string,
  entityId: string,
  action = 'update',
) {
  await db().transaction(async (transaction) => {
    await recordAudit(
      {
        actorId: actor?.id ?? null,
        action,
        entityType,
        entityId,
        before: { n: 1 },
        after: { n: 2 },
        reason: 'test',
      },
      transaction,
    );
  });
  await asSchemaOwner(async (client) => {
    await client.query('begin');
    await client.query('alter table audit_events disable trigger audit_events_no_update');
    await client.query(
      'update audit_events set occurred_at = $1 where id = (select max(id) from audit_events)',
      [at],
    );
    await client.query('alter table audit_events enable trigger audit_events_no_update');
    await client.query('commit');
  });
}

describe('the append-only audit trail', () => {
  beforeAll(async () => {
    await resetDatabase();
    admin = await makeActor(['admin']);
    approver = await makeActor(['approver']);
    // Back-dating needs the guard lifted, as only the schema's owner may (test set-up); the app's role cannot.
    await eventAt(admin, '2026-11-30T23:59:59Z', 'user', 'u-1', 'create');
    await eventAt(admin, '2026-12-01T08:00:00Z', 'plate', 'p-1');
    await eventAt(approver, '2026-12-01T09:30:10Z', 'plate', 'p-1', 'sign');
    await eventAt(approver, '2026-12-01T09:31:00Z', 'plate', 'p-2', 'sign');
    await eventAt(null, '2026-12-02T00:00:00Z', 'session', 'nobody', 'sign_in_failed');
  });
  afterAll(async () => {
    await db().close();
  });

  test.each([
    ['update', `update audit_events set reason = 'rewritten'`],
    ['delete', 'delete from audit_events'],
    ['truncate', 'truncate audit_events'],
  ])(
    'the database refuses %s on audit_events: the app is not granted it, and the owner meets the trigger',
    async (operation, sql) => {
      await expect(db().query(sql)).rejects.toThrow('permission denied for table audit_events');
      await expect(asSchemaOwner((client) => client.query(sql))).rejects.toThrow(
        `audit_events is append-only: ${operation.toUpperCase()} refused`,
      );
      expect(await AuditEvent.count()).toBe(5);
    },
  );

  test.each([
    'alter table audit_events disable trigger audit_events_no_update',
    'alter table plates disable trigger plates_locked',
    'drop trigger signatures_no_change on signatures',
    'drop table signoff_events',
  ])('the app cannot lift a guard or drop a table: %s', async (sql) => {
    await expect(db().query(sql)).rejects.toThrow(/must be owner of (table|relation)/);
  });

  test.each(['signatures', 'signoff_events'])(
    'the app may read and add to %s but not change or remove a row',
    async (table) => {
      const [grants] = await db().query(
        `select privilege_type from information_schema.role_table_grants where table_name = :table and grantee = current_user order by 1`,
        { replacements: { table } },
      );
      expect(grants.map((row) => (row as { privilege_type: string }).privilege_type)).toEqual([
        'INSERT',
        'SELECT',
      ]);
    },
  );

  test.each<[Record<string, string>, number]>([
    [{}, 5],
    [{ entityType: 'plate' }, 3],
    [{ entityType: 'plate', entityId: 'p-1' }, 2],
    [{ userId: 'approver' }, 2],
    [{ from: '2026-12-01T09:30', to: '2026-12-01T09:30' }, 1],
    [{ from: '2026-12-01', to: '2026-12-01' }, 3],
    [{ to: '2026-11-30' }, 1],
    [{ from: '2026-12-01T09:31:00+00:00' }, 2],
  ])('filters %o in the database: %i events', async (filter, expected) => {
    const withIds = { ...filter, userId: filter.userId === 'approver' ? approver.id : undefined };
    const page = await searchAudit(admin, withIds);
    expect(page.total).toBe(expected);
    expect(page.rows).toHaveLength(expected);
  });

  test('rows come newest first with actor, time, action, record, reason and before/after', async () => {
    const { rows } = await searchAudit(approver, { entityType: 'plate' });
    expect(rows.map((row) => row.occurredAt)).toEqual([
      '2026-12-01T09:31:00.000Z',
      '2026-12-01T09:30:10.000Z',
      '2026-12-01T08:00:00.000Z',
    ]);
    expect(rows[0]).toMatchObject({
      actorName: approver.name,
      actorEmail: approver.email,
      action: 'sign',
      entityType: 'plate',
      entityId: 'p-2',
      reason: 'test',
      before: { n: 1 },
      after: { n: 2 },
    });
  });

  test('bad filters are refused with messages keyed by field', async () => {
    await expect(searchAudit(admin, { from: '2026-12-02', to: '2026-12-01' })).rejects.toMatchObject({
      code: 'invalid',
      details: { fieldErrors: { to: ['The end of the range is before its start.'] } },
    });
    await expect(searchAudit(admin, { from: 'yesterday', userId: 'bob' })).rejects.toMatchObject({
      details: {
        fieldErrors: {
          from: ['Use a date and time such as 2026-12-01T09:30 (UTC).'],
          userId: ['Choose a person from the list.'],
        },
      },
    });
  });

  test.each([['chemist'], ['biologist']] as const)('a %s may not read the audit trail', async (role) => {
    const someone = await makeActor([role]);
    await expect(searchAudit(someone, {})).rejects.toMatchObject({ code: 'forbidden' });
    await expect(auditFilterChoices(someone)).rejects.toMatchObject({ code: 'forbidden' });
  });

  test('an export holds every event the filter selects, all pages, newest first, with the filter in its about lines', async () => {
    const document = await auditExport(approver, { entityType: 'plate', page: '2' });
    const [table] = document.tables;
    expect(table!.rows.map((row) => row[1])).toEqual([
      '2026-12-01T09:31:00.000Z',
      '2026-12-01T09:30:10.000Z',
      '2026-12-01T08:00:00.000Z',
    ]);
    // December in UTC: the local time is the UTC wall clock.
    expect(table!.rows[0]!.slice(2)).toEqual([
      '2026-12-01 09:31:00',
      approver.name,
      'approver',
      approver.email,
      'Signed',
      'Plate',
      null,
      'N: 1 → 2',
      'sign',
      'plate',
      'p-2',
      'test',
      '{"n":1}',
      '{"n":2}',
      null,
    ]);
    expect(document.about).toEqual(
      expect.arrayContaining([
        ['Filter', 'record type plate'],
        ['Events', 3],
        ['Exported by', `${approver.name} <${approver.email}>`],
      ]),
    );
    // RFC 4180 csv: the JSON's quotes doubled inside a quoted field.
    const csv = csvText(document, table!);
    expect(csv).toContain(`,sign,plate,p-2,test,"{""n"":1}","{""n"":2}",\r\n`);
    expect((await auditExport(admin, { from: '2026-12-01T09:30', to: '2026-12-01T09:30' })).about).toEqual(
      expect.arrayContaining([
        ['Filter', 'from 2026-12-01T09:30:00Z; before 2026-12-01T09:31:00Z'],
        ['Events', 1],
      ]),
    );
  });

  test('an export past its limit is refused with a clear message, and other roles may not export', async () => {
    await expect(auditEventsForExport(admin, {}, 4)).rejects.toMatchObject({
      code: 'invalid',
      message:
        'More than 4 events match; an export holds at most that many. Narrow the time range or the filter.',
    });
    expect((await auditEventsForExport(admin, {}, 5)).rows).toHaveLength(5);
    await expect(auditExport(await makeActor(['chemist']), {})).rejects.toMatchObject({ code: 'forbidden' });
    await expect(auditExport(admin, { to: 'soon' })).rejects.toMatchObject({ code: 'invalid' });
  });

  test('filter choices list the record types and kinds of event that occur and every person', async () => {
    const choices = await auditFilterChoices(approver);
    expect(choices.entityTypes).toEqual(['plate', 'session', 'user']);
    expect(choices.actions).toEqual(['create', 'sign', 'sign_in_failed', 'update']);
    expect(choices.people.map((p) => p.id)).toEqual(expect.arrayContaining([admin.id, approver.id]));
  });
});
