'use strict';
// Imports run as jobs too: the web server keeps the upload and its request in import_uploads and queues a
// plate-import job in the same transaction; a worker reads, checks and stores the plate and removes the
// upload in its own transaction. compute_jobs.outcome keeps what a refused job leaves for the request that
// waits on it (the refusal's code and details, such as the rows in error).

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        alter table compute_jobs drop constraint compute_jobs_kind_check;
        alter table compute_jobs add constraint compute_jobs_kind_check
          check (kind in ('plate-fits', 'forecast', 'plate-forecasts', 'plate-import'));
        alter table compute_jobs add column outcome jsonb;

        create table import_uploads (
          id uuid primary key default gen_random_uuid(),
          requested_by uuid not null references users (id) on delete restrict,
          address text,
          request jsonb not null,
          bytes bytea not null,
          created_at timestamptz not null default now()
        );
        create index import_uploads_created_at on import_uploads (created_at);
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        drop table if exists import_uploads;
        delete from compute_jobs where kind = 'plate-import';
        alter table compute_jobs drop column if exists outcome;
        alter table compute_jobs drop constraint compute_jobs_kind_check;
        alter table compute_jobs add constraint compute_jobs_kind_check
          check (kind in ('plate-fits', 'forecast', 'plate-forecasts'));
        `,
        { transaction },
      );
    });
  },
};
