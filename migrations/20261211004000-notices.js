'use strict';
// Notices in Gatewell: each message the app mails about a plate or an import waiting for compounds is
// also kept here for its recipient, written in the transaction of the event that caused it
// (lib/notices/queue.ts), so an event that is refused or rolled back leaves no notice. A person reads
// them on the Notices page and marks them seen (seen_at). notice_delivery holds each person's choice of
// "by e-mail and in Gatewell" (no row: the default) or "in Gatewell only".

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(`
      create table notices (
        id uuid primary key default gen_random_uuid(),
        recipient_id uuid not null references users(id),
        kind text not null check (kind in (
          'plate_imported', 'plate_verified', 'plate_submitted', 'plate_approved', 'plate_rejected',
          'plate_reopened', 'import_waiting_for_compounds', 'import_compounds_ready')),
        title text not null check (length(title) between 1 and 300),
        body_text text not null,
        -- A path inside the app (never a whole address): the plate, the compound or the waiting import.
        link_path text not null check (link_path ~ '^/[^/]'),
        plate_id uuid references plates(id),
        signoff_event_id uuid references signoff_events(id),
        created_at timestamptz not null default now(),
        seen_at timestamptz
      );
      -- The Notices page: one person's notices, newest first, paged.
      create index notices_recipient_newest on notices (recipient_id, created_at desc, id desc);
      -- The bell: one person's unseen notices, counted on every signed-in page.
      create index notices_recipient_unseen on notices (recipient_id) where seen_at is null;

      create table notice_delivery (
        user_id uuid primary key references users(id),
        delivery text not null check (delivery in ('mail_and_app', 'app_only')),
        updated_at timestamptz not null default now()
      );
    `);
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query('drop table notice_delivery; drop table notices;');
  },
};
