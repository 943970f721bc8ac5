'use strict';
// Fits and forecasts run as jobs on a PostgreSQL-backed queue (pg-boss, in its own schema "pgboss",
// which pg-boss creates and migrates itself when a process starts it). This migration adds what
// Gatewell keeps of each job for people to see: its state and progress, and on each plate whether
// its fits still wait for a recomputation.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        -- True from an import or a change to wells or models until a worker has refitted the plate.
        alter table plates
          add column fits_pending boolean not null default false,
          add column fits_requested_at timestamptz,
          add column fitted_at timestamptz;
        update plates set fitted_at = imported_at;
        -- What is submitted or approved was signed over current fits.
        alter table plates add constraint plates_fits_current_when_signed
          check (not (fits_pending and state in ('submitted', 'approved')));

        create table compute_jobs (
          id uuid primary key,
          kind text not null check (kind in ('plate-fits', 'forecast', 'plate-forecasts')),
          job_key text not null,
          plate_id uuid references plates (id) on delete restrict,
          compound_id uuid references compounds (id) on delete restrict,
          requested_by uuid references users (id) on delete restrict,
          state text not null default 'queued' check (state in ('queued', 'running', 'done', 'failed')),
          done integer not null default 0 check (done >= 0),
          total integer check (total is null or total >= 0),
          message text,
          attempts integer not null default 0,
          worker text,
          created_at timestamptz not null default now(),
          started_at timestamptz,
          finished_at timestamptz
        );
        create index compute_jobs_plate on compute_jobs (plate_id, created_at desc);
        create index compute_jobs_open_key on compute_jobs (job_key) where state in ('queued', 'running');
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        drop table if exists compute_jobs;
        alter table plates drop constraint if exists plates_fits_current_when_signed;
        alter table plates drop column if exists fits_pending, drop column if exists fits_requested_at, drop column if exists fitted_at;
        `,
        { transaction },
      );
    });
  },
};
