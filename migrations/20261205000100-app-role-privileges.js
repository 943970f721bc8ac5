'use strict';
// Two database roles: migrations run as the schema's owner (DATABASE_OWNER_URL), the app as a role of
// its own (DATABASE_URL) that may read and write rows but owns no table of the public schema. So the
// app can neither alter a table nor lift a trigger, and on the append-only tables (audit trail,
// signatures, sign-off events) it may only read and add: UPDATE, DELETE and TRUNCATE are not granted.
// The app's role may create schemas in the database, as pg-boss creates and migrates its own ("pgboss",
// QUEUE_SCHEMA in lib/jobs/queue.ts) when a process starts it; the app owns that schema, not the public
// one. The owner is a member of the app's role (scripts/pg.sh makes it so) to read the queue for backups
// and to restore it; the app's role is no member of the owner's. Where both URLs name one role there is
// nothing to do.

const APPEND_ONLY = ['audit_events', 'signatures', 'signoff_events'];

/** The app's role: the user DATABASE_URL names. */
function appRole() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set: the migration grants to the role it names');
  return decodeURIComponent(new URL(url).username);
}

/** Double-quotes an identifier as PostgreSQL does (quote_ident). */
function ident(name) {
  return `"${name.replace(/"/g, '""')}"`;
}

/**
 * Runs the SQL that `statements` makes from the app's role and the database (both quoted) in one
 * transaction; nothing when the app's role is the one migrating (a single-role set-up).
 */
async function forAppRole(queryInterface, statements) {
  await queryInterface.sequelize.transaction(async (transaction) => {
    const [[{ me, database }]] = await queryInterface.sequelize.query(
      'select current_user as me, current_database() as database',
      { transaction },
    );
    const role = appRole();
    if (role === me) return;
    await queryInterface.sequelize.query(statements(ident(role), ident(database)), { transaction });
  });
}

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await forAppRole(
      queryInterface,
      (app, database) => `
      grant connect, create on database ${database} to ${app};
      grant usage on schema public to ${app};
      grant select, insert, update, delete on all tables in schema public to ${app};
      revoke update, delete, truncate on ${APPEND_ONLY.join(', ')} from ${app};
      grant usage, select on all sequences in schema public to ${app};
      -- Tables and sequences later migrations add (created by this owner) get the same rows access.
      alter default privileges in schema public grant select, insert, update, delete on tables to ${app};
      alter default privileges in schema public grant usage, select on sequences to ${app};
    `,
    );
  },

  async down(queryInterface) {
    await forAppRole(
      queryInterface,
      (app, database) => `
      revoke create on database ${database} from ${app};
      alter default privileges in schema public revoke select, insert, update, delete on tables from ${app};
      alter default privileges in schema public revoke usage, select on sequences from ${app};
      revoke all on all sequences in schema public from ${app};
      revoke all on all tables in schema public from ${app};
    `,
    );
  },
};
