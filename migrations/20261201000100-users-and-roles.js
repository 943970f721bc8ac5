'use strict';
// Users, their roles (a user may hold several), login attempts for throttling, and e-signatures.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        create table users (
          id uuid primary key default gen_random_uuid(),
          email text not null,
          name text not null,
          password_hash text not null,
          session_version integer not null default 1,
          disabled_at timestamptz,
          password_changed_at timestamptz not null default now(),
          last_sign_in_at timestamptz,
          created_at timestamptz not null default now(),
          updated_at timestamptz not null default now(),
          constraint users_email_format check (email = lower(email) and email like '%_@_%'),
          constraint users_name_present check (length(trim(name)) > 0),
          constraint users_session_version_positive check (session_version > 0)
        );
        create unique index users_email_unique on users (email);

        create table user_roles (
          user_id uuid not null references users (id) on delete cascade,
          role text not null,
          granted_at timestamptz not null default now(),
          primary key (user_id, role),
          constraint user_roles_known check (role in ('chemist', 'biologist', 'approver', 'admin'))
        );
        create index user_roles_role on user_roles (role);

        create table login_attempts (
          id bigserial primary key,
          email text not null,
          address text not null,
          succeeded boolean not null,
          attempted_at timestamptz not null default now()
        );
        create index login_attempts_email_time on login_attempts (email, attempted_at);
        create index login_attempts_address_time on login_attempts (address, attempted_at);

        create table signatures (
          id uuid primary key default gen_random_uuid(),
          signer_id uuid not null references users (id),
          meaning text not null,
          comment text not null default '',
          entity_type text not null,
          entity_id uuid not null,
          content_sha256 char(64) not null,
          signed_at timestamptz not null default now(),
          constraint signatures_meaning_present check (length(trim(meaning)) > 0),
          constraint signatures_sha256_hex check (content_sha256 ~ '^[0-9a-f]{64}$')
        );
        create index signatures_entity on signatures (entity_type, entity_id, signed_at);
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(
      'drop table if exists signatures, login_attempts, user_roles, users cascade',
    );
  },
};
