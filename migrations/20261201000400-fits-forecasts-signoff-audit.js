'use strict';
// Hill fits, excitability forecasts, sign-off events, the append-only audit trail, and the plate lock.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        create table fits (
          id uuid primary key default gen_random_uuid(),
          plate_id uuid not null references plates (id) on delete restrict,
          compound_id uuid not null references compounds (id) on delete restrict,
          target_id uuid not null references targets (id) on delete restrict,
          model text not null default 'hill2',
          status text not null,
          message text not null default '',
          ic50_um double precision,
          ic50_ci_low_um double precision,
          ic50_ci_high_um double precision,
          ic50_lower_bound_um double precision,
          log10_ic50_se double precision,
          hill double precision,
          top double precision,
          bottom double precision,
          r2 double precision,
          residual_sd double precision,
          n integer not null,
          flags jsonb not null default '[]',
          estimate jsonb,
          computed_by uuid references users (id),
          computed_at timestamptz not null default now(),
          constraint fits_model_known check (model in ('hill2', 'hill4')),
          constraint fits_status_known check (status in ('fitted', 'above_range', 'inactive', 'insufficient', 'not_converged')),
          constraint fits_fitted_has_ic50 check (status <> 'fitted' or (ic50_um > 0 and hill is not null)),
          constraint fits_not_converged_no_numbers check (status <> 'not_converged' or ic50_um is null),
          constraint fits_n_nonnegative check (n >= 0)
        );
        create unique index fits_plate_compound_target_unique on fits (plate_id, compound_id, target_id);
        create index fits_compound on fits (compound_id);

        create table forecasts (
          id uuid primary key default gen_random_uuid(),
          plate_id uuid references plates (id) on delete restrict,
          compound_id uuid not null references compounds (id) on delete restrict,
          screen_id uuid not null references screens (id) on delete restrict,
          preset text not null,
          input_sha256 char(64) not null,
          input jsonb not null,
          result jsonb not null,
          computed_at timestamptz not null default now()
        );
        create index forecasts_compound on forecasts (compound_id, computed_at desc);
        create index forecasts_plate on forecasts (plate_id);
        create unique index forecasts_input_unique on forecasts (plate_id, compound_id, input_sha256);

        create table signoff_events (
          id uuid primary key default gen_random_uuid(),
          plate_id uuid not null references plates (id) on delete restrict,
          signature_id uuid not null references signatures (id) on delete restrict,
          from_state text not null,
          to_state text not null,
          occurred_at timestamptz not null default now(),
          constraint signoff_events_states check (
            (from_state, to_state) in (('imported', 'verified'), ('verified', 'submitted'),
              ('submitted', 'approved'), ('submitted', 'rejected'), ('rejected', 'imported'))
          )
        );
        create index signoff_events_plate on signoff_events (plate_id, occurred_at);

        create table audit_events (
          id bigserial primary key,
          occurred_at timestamptz not null default now(),
          actor_id uuid references users (id) on delete restrict,
          action text not null,
          entity_type text not null,
          entity_id text,
          before jsonb,
          after jsonb,
          reason text,
          address text,
          constraint audit_events_action_present check (length(trim(action)) > 0)
        );
        create index audit_events_time on audit_events (occurred_at desc);
        create index audit_events_entity on audit_events (entity_type, entity_id, occurred_at);
        create index audit_events_actor on audit_events (actor_id, occurred_at desc);

        -- The audit trail is append-only: no role may change or remove what it holds.
        create function gatewell_audit_append_only() returns trigger language plpgsql as $$
        begin
          raise exception 'audit_events is append-only: % refused', tg_op using errcode = 'P0001';
        end $$;
        create trigger audit_events_no_update before update or delete on audit_events
          for each row execute function gatewell_audit_append_only();
        create trigger audit_events_no_truncate before truncate on audit_events
          for each statement execute function gatewell_audit_append_only();

        -- An approved plate is locked: its row, wells, readouts and fits can no longer change.
        create function gatewell_refuse_approved_plate() returns trigger language plpgsql as $$
        declare
          plate uuid;
          plate_state text;
        begin
          if tg_table_name = 'plates' then
            if old.state = 'approved' then
              raise exception 'plate % is approved and locked', old.id using errcode = 'P0002';
            end if;
            return coalesce(new, old);
          elsif tg_table_name = 'readouts' then
            select w.plate_id into plate from wells w where w.id = coalesce(new.well_id, old.well_id);
          else
            plate := coalesce(new.plate_id, old.plate_id);
          end if;
          select p.state into plate_state from plates p where p.id = plate;
          if plate_state = 'approved' then
            raise exception 'plate % is approved and locked', plate using errcode = 'P0002';
          end if;
          return coalesce(new, old);
        end $$;
        create trigger plates_locked before update or delete on plates
          for each row execute function gatewell_refuse_approved_plate();
        create trigger wells_locked before insert or update or delete on wells
          for each row execute function gatewell_refuse_approved_plate();
        create trigger readouts_locked before insert or update or delete on readouts
          for each row execute function gatewell_refuse_approved_plate();
        create trigger fits_locked before insert or update or delete on fits
          for each row execute function gatewell_refuse_approved_plate();
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      drop table if exists audit_events, signoff_events, forecasts, fits cascade;
      drop function if exists gatewell_audit_append_only() cascade;
      drop function if exists gatewell_refuse_approved_plate() cascade;
    `);
  },
};
