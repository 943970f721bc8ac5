'use strict';
// Import drafts: inspect reads and parses an upload once and keeps it here, with its sheets as plain
// values (JSONB) and its bytes (for the stored file record), for its owner only, until it expires. Preview
// and commit name the draft instead of sending the file again; the commit consumes it (consumed_at,
// plate_id) in the transaction that stores the plate and drops the sheets and bytes, so that a second
// commit of the same draft is refused by name. The job sweep removes expired drafts.
// A queued import (import_uploads) now holds either the file's bytes (a commit that sent the file) or
// the draft it takes its sheets from, never both.
// The app's role reads and writes draft rows (the table is not append-only): the default privileges of
// migration 20261205000100 already grant that for tables the owner creates; the grant is repeated here by
// name so that the table does not depend on which role ran the migration.

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

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        create table import_drafts (
          id uuid primary key default gen_random_uuid(),
          owner_id uuid not null references users (id) on delete cascade,
          screen_id uuid not null references screens (id) on delete cascade,
          filename text not null check (length(filename) between 1 and 255),
          media_type text not null,
          sha256 char(64) not null check (sha256 ~ '^[0-9a-f]{64}$'),
          size_bytes integer not null check (size_bytes > 0),
          sheets jsonb check (jsonb_typeof(sheets) = 'array'),
          bytes bytea check (octet_length(bytes) = size_bytes),
          created_at timestamptz not null default now(),
          expires_at timestamptz not null,
          consumed_at timestamptz,
          plate_id uuid references plates (id) on delete set null,
          constraint import_drafts_expires_after_created check (expires_at > created_at),
          constraint import_drafts_content_until_consumed check ((consumed_at is null) = (sheets is not null and bytes is not null))
        );
        create index import_drafts_expires_at on import_drafts (expires_at);

        alter table import_uploads alter column bytes drop not null;
        alter table import_uploads add column draft_id uuid references import_drafts (id) on delete cascade;
        alter table import_uploads add constraint import_uploads_bytes_or_draft check (num_nonnulls(bytes, draft_id) = 1);
        `,
        { transaction },
      );
      const [[{ me }]] = await queryInterface.sequelize.query('select current_user as me', { transaction });
      const role = appRole();
      if (role !== me) {
        await queryInterface.sequelize.query(
          `grant select, insert, update, delete on import_drafts to ${ident(role)}`,
          { transaction },
        );
      }
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        delete from import_uploads where bytes is null;
        alter table import_uploads drop constraint if exists import_uploads_bytes_or_draft;
        alter table import_uploads drop column if exists draft_id;
        alter table import_uploads alter column bytes set not null;
        drop table if exists import_drafts;
        `,
        { transaction },
      );
    });
  },
};
