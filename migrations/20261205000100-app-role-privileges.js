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

async function separateAppRole(queryInterface, transaction) {
  const role = appRole();
  const [[me]] = await queryInterface.sequelize.query('select current_user as name', { transaction });
  return role === me.name ? null : role;
}

/** Double-quotes an identifier as PostgreSQL does (quote_ident). */
function ident(name) {
  return `"${name.replace(/"/g, '""')}"`;
}

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      const role = await separateAppRole(queryInterface, transaction);
      if (!role) return;
      const app = ident(role);
      const [[database]] = await queryInterface.sequelize.query('select current_database() as name', { transaction });
      await queryInterface.sequelize.query(
        `
        grant connect, create on database ${ident(database.name)} to ${app};
        grant usage on schema public to ${app};
        grant select, insert, update, delete on all tables in schema public to ${app};
        revoke update, delete, truncate on ${APPEND_ONLY.join(', ')} from ${app};
        grant usage, select on all sequences in schema public to ${app};
        -- Tables and sequences later migrations add (created by this owner) get the same rows access.
        alter default privileges in schema public grant select, insert, update, delete on tables to ${app};
        alter default privileges in schema public grant usage, select on sequences to ${app};
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      const role = await separateAppRole(queryInterface, transaction);
      if (!role) return;
      const app = ident(role);
      const [[database]] = await queryInterface.sequelize.query('select current_database() as name', { transaction });
      await queryInterface.sequelize.query(
        `
        revoke create on database ${ident(database.name)} from ${app};
        alter default privileges in schema public revoke select, insert, update, delete on tables from ${app};
        alter default privileges in schema public revoke usage, select on sequences from ${app};
        revoke all on all sequences in schema public from ${app};
        revoke all on all tables in schema public from ${app};
        `,
        { transaction },
      );
    });
  },
};
