'use strict';
// Value maps and plate facts (issue 18): a target's other names per screen (target_aliases), so a file
// that writes a target its own way maps with no clicks the next time; the plate facts read from outside
// the table (barcode, run date, cell line, temperature, operator) kept with the plate (plates.facts); and
// the header fingerprint of a template's layout (import_templates.fingerprint), so a second file of the
// same layout is recognised and mapped with the template.

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
        create table target_aliases (
          id uuid primary key default gen_random_uuid(),
          screen_id uuid not null references screens (id) on delete cascade,
          target_id uuid not null references targets (id) on delete cascade,
          alias text not null check (length(trim(alias)) between 1 and 100),
          alias_key text not null check (alias_key ~ '^[a-z0-9]+$'),
          created_by uuid not null references users (id),
          created_at timestamptz not null default now()
        );
        create unique index target_aliases_screen_key on target_aliases (screen_id, alias_key);
        create index target_aliases_target on target_aliases (target_id);

        alter table plates add column facts jsonb not null default '{}'::jsonb
          constraint plates_facts_object check (jsonb_typeof(facts) = 'object');

        alter table import_templates add column fingerprint text;
        create index import_templates_fingerprint on import_templates (fingerprint) where fingerprint is not null;
        `,
        { transaction },
      );
      const [[{ me }]] = await queryInterface.sequelize.query('select current_user as me', { transaction });
      const role = appRole();
      if (role !== me) {
        await queryInterface.sequelize.query(
          `grant select, insert, update, delete on target_aliases to ${ident(role)}`,
          { transaction },
        );
      }
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        drop index if exists import_templates_fingerprint;
        alter table import_templates drop column if exists fingerprint;
        alter table plates drop column if exists facts;
        drop table if exists target_aliases;
        `,
        { transaction },
      );
    });
  },
};
