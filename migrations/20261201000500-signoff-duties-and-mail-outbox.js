'use strict';
// Sign-off: segregation of duties beyond the decider check, signatures and sign-off events kept
// unchanged once written, and the mail outbox that notifications are queued in with each transition.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        -- The chemist who verifies a compound map did not import the plate; whoever approves or returns
        -- a plate neither imported, verified (plates_decider_independent) nor submitted it.
        alter table plates
          add constraint plates_verifier_independent check (verified_by is null or verified_by <> imported_by),
          add constraint plates_decider_not_submitter check (decided_by is null or decided_by is distinct from submitted_by);

        -- A signature and the transition it signed are evidence: rows may be added, never changed or removed.
        create function gatewell_signoff_append_only() returns trigger language plpgsql as $$
        begin
          raise exception '% is append-only: % refused', tg_table_name, tg_op using errcode = 'P0001';
        end $$;
        create trigger signatures_no_change before update or delete on signatures
          for each row execute function gatewell_signoff_append_only();
        create trigger signoff_events_no_change before update or delete on signoff_events
          for each row execute function gatewell_signoff_append_only();

        create table mail_outbox (
          id uuid primary key default gen_random_uuid(),
          kind text not null,
          plate_id uuid references plates (id) on delete restrict,
          signoff_event_id uuid references signoff_events (id) on delete restrict,
          recipient_id uuid not null references users (id) on delete restrict,
          to_address text not null,
          subject text not null,
          body_text text not null,
          state text not null default 'queued',
          attempts integer not null default 0,
          max_attempts integer not null default 8,
          next_attempt_at timestamptz not null default now(),
          last_attempt_at timestamptz,
          last_error text,
          smtp_response text,
          created_at timestamptz not null default now(),
          sent_at timestamptz,
          constraint mail_outbox_kind_known check (kind in (
            'plate_imported', 'plate_verified', 'plate_submitted', 'plate_approved', 'plate_rejected', 'plate_reopened')),
          constraint mail_outbox_state_known check (state in ('queued', 'sent', 'failed')),
          constraint mail_outbox_sent_has_time check ((state = 'sent') = (sent_at is not null)),
          constraint mail_outbox_attempts check (attempts >= 0 and max_attempts > 0),
          constraint mail_outbox_address check (to_address like '%_@_%'),
          constraint mail_outbox_subject_present check (length(trim(subject)) > 0)
        );
        create index mail_outbox_due on mail_outbox (next_attempt_at) where state = 'queued';
        create index mail_outbox_time on mail_outbox (created_at desc);
        create index mail_outbox_plate on mail_outbox (plate_id);
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      drop table if exists mail_outbox;
      drop trigger if exists signatures_no_change on signatures;
      drop trigger if exists signoff_events_no_change on signoff_events;
      drop function if exists gatewell_signoff_append_only();
      alter table plates drop constraint if exists plates_verifier_independent, drop constraint if exists plates_decider_not_submitter;
    `);
  },
};
