'use strict';
// Segregation of duties on every sign-off step of a plate, kept by the database, and the QC warnings a
// signer acknowledged, kept with the signed transition.
//
// The rule. A plate's sign-off goes in rounds: the first round starts at import, and each rework
// (rejected → imported) closes the round it follows and starts the next. The duty steps of a round are
// verify, submit, and the decision (approve or reject); in one round each of them is signed by a
// different person, whatever roles their accounts hold. The rework signature is no duty of either round:
// whoever reopens the plate may take any duty in the next one. A new round is judged afresh: someone who
// returned the plate may verify, submit or decide in the next round, as long as the three duties of that
// round are again three people. Import is not a signature: the importer rules stay as CHECKs on plates
// (plates_verifier_independent, plates_decider_independent).
//
// Where it is kept:
// - plates: the submitter is not the verifier (plates_submitter_not_verifier, beside the earlier CHECKs
//   on the *_by columns, which rework clears and so describe the current round);
// - signoff_events: each row knows its round (set by the trigger below, whatever the insert says), and
//   the trigger refuses a second duty signature of one signer in one round of one plate. It first locks
//   the plate row, so two sign-offs of one plate never check at once: the later waits for the earlier to
//   commit or roll back, and then reads what it wrote (each statement of a volatile function takes a new
//   snapshot under READ COMMITTED; under REPEATABLE READ or SERIALIZABLE the wait ends in a
//   serialization failure instead).

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        alter table plates
          add constraint plates_submitter_not_verifier check (submitted_by is null or submitted_by is distinct from verified_by);

        alter table signoff_events
          add column round integer,
          add column qc_warnings jsonb not null default '[]',
          add constraint signoff_events_qc_warnings_array check (jsonb_typeof(qc_warnings) = 'array');

        -- The round of the rows already there: the reworks of their plate before them (the rework's own
        -- row belongs to the round it closes). Sign-off events are append-only; their owner lifts the
        -- guard for this one statement, in this transaction.
        alter table signoff_events disable trigger signoff_events_no_change;
        update signoff_events e set round = (
          select count(*) from signoff_events r
           where r.plate_id = e.plate_id and r.to_state = 'imported' and (r.occurred_at, r.id) < (e.occurred_at, e.id));
        alter table signoff_events enable trigger signoff_events_no_change;
        alter table signoff_events
          alter column round set not null,
          add constraint signoff_events_round_positive check (round >= 0);
        create index signoff_events_plate_round on signoff_events (plate_id, round);

        create function gatewell_signoff_duties() returns trigger language plpgsql as $$
        declare
          signer uuid;
          earlier text;
        begin
          -- One sign-off of a plate at a time (see the comment of this migration).
          perform 1 from plates where id = new.plate_id for update;
          select s.signer_id into signer from signatures s
           where s.id = new.signature_id and s.entity_type = 'plate' and s.entity_id = new.plate_id;
          if signer is null then
            raise exception 'signoff_events: signature % is not a signature of plate %', new.signature_id, new.plate_id
              using errcode = '23514', constraint = 'signoff_events_signature_of_plate';
          end if;
          new.round := (select count(*) from signoff_events where plate_id = new.plate_id and to_state = 'imported');
          if new.to_state = 'imported' then
            return new; -- rework: no duty of the round
          end if;
          select e.to_state into earlier from signoff_events e join signatures s on s.id = e.signature_id
           where e.plate_id = new.plate_id and e.round = new.round and e.to_state <> 'imported' and s.signer_id = signer
           limit 1;
          if earlier is not null then
            raise exception 'segregation of duties: user % already signed the step to % of plate % in this round', signer, earlier, new.plate_id
              using errcode = '23514', constraint = 'signoff_events_one_duty_per_round';
          end if;
          return new;
        end $$;
        create trigger signoff_events_duties before insert on signoff_events
          for each row execute function gatewell_signoff_duties();
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      drop trigger if exists signoff_events_duties on signoff_events;
      drop function if exists gatewell_signoff_duties();
      drop index if exists signoff_events_plate_round;
      alter table signoff_events disable trigger signoff_events_no_change;
      alter table signoff_events drop constraint if exists signoff_events_round_positive,
        drop constraint if exists signoff_events_qc_warnings_array, drop column if exists round, drop column if exists qc_warnings;
      alter table signoff_events enable trigger signoff_events_no_change;
      alter table plates drop constraint if exists plates_submitter_not_verifier;
    `);
  },
};
