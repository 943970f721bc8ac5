'use strict';
// Compound identifiers a file uses that are not in the registry: a chemist registers them from the import
// or maps each to a registered compound as an alias (compound_aliases), which every later import reads,
// so the next file with that identifier resolves without a click. An alias is unique regardless of case
// and never equal to a registered identifier (the service checks both under a lock).
// An import draft whose owner may not register compounds waits for them: waiting_since, the identifiers
// it waits for (waiting_for) and the sheet, mapping, format and label chosen (waiting_choice). A waiting
// draft is kept past its expiry until it is stored or its owner discards it.
// The outbox learns two kinds: the notice to the people who may register, and the one to the owner once
// nothing is missing any more.

const KINDS = [
  'plate_imported',
  'plate_verified',
  'plate_submitted',
  'plate_approved',
  'plate_rejected',
  'plate_reopened',
  'password_link',
  'account_invitation',
];
const NEW_KINDS = ['import_waiting_for_compounds', 'import_compounds_ready'];

function kindCheck(kinds) {
  return `alter table mail_outbox drop constraint mail_outbox_kind_known,
    add constraint mail_outbox_kind_known check (kind in (${kinds.map((k) => `'${k}'`).join(', ')}))`;
}

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
        create table compound_aliases (
          id uuid primary key default gen_random_uuid(),
          alias text not null check (length(alias) between 1 and 64 and alias = btrim(alias)),
          compound_id uuid not null references compounds (id) on delete cascade,
          created_by uuid not null references users (id),
          created_at timestamptz not null default now()
        );
        create unique index compound_aliases_upper_alias on compound_aliases (upper(alias));
        create index compound_aliases_compound on compound_aliases (compound_id);

        alter table import_drafts
          add column waiting_since timestamptz,
          add column waiting_for text[],
          add column waiting_choice jsonb,
          add constraint import_drafts_waiting_whole check (
            (waiting_since is null) = (waiting_for is null) and (waiting_since is null) = (waiting_choice is null)),
          add constraint import_drafts_waiting_for_some check (waiting_for is null or cardinality(waiting_for) > 0);
        create index import_drafts_waiting on import_drafts (waiting_since) where waiting_since is not null and consumed_at is null;
        ${kindCheck([...KINDS, ...NEW_KINDS])};
        `,
        { transaction },
      );
      const [[{ me }]] = await queryInterface.sequelize.query('select current_user as me', { transaction });
      const role = appRole();
      if (role !== me) {
        await queryInterface.sequelize.query(
          `grant select, insert, update, delete on compound_aliases to ${ident(role)}`,
          { transaction },
        );
      }
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        delete from mail_outbox where kind in (${NEW_KINDS.map((k) => `'${k}'`).join(', ')});
        ${kindCheck(KINDS)};
        drop index if exists import_drafts_waiting;
        alter table import_drafts
          drop constraint if exists import_drafts_waiting_for_some,
          drop constraint if exists import_drafts_waiting_whole,
          drop column if exists waiting_choice,
          drop column if exists waiting_for,
          drop column if exists waiting_since;
        drop table if exists compound_aliases;
        `,
        { transaction },
      );
    });
  },
};
