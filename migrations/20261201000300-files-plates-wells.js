'use strict';
// Import templates, uploaded files (raw bytes and SHA-256), plates with their sign-off state, wells and readouts.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        create table import_templates (
          id uuid primary key default gen_random_uuid(),
          name text not null,
          mapping jsonb not null,
          created_by uuid not null references users (id),
          created_at timestamptz not null default now(),
          updated_at timestamptz not null default now(),
          constraint import_templates_name_present check (length(trim(name)) > 0),
          constraint import_templates_mapping_object check (jsonb_typeof(mapping) = 'object')
        );
        create unique index import_templates_name_unique on import_templates (lower(name));

        create table uploaded_files (
          id uuid primary key default gen_random_uuid(),
          screen_id uuid not null references screens (id) on delete restrict,
          filename text not null,
          media_type text not null,
          size_bytes integer not null,
          sha256 char(64) not null,
          content bytea not null,
          uploaded_by uuid not null references users (id),
          uploaded_at timestamptz not null default now(),
          constraint uploaded_files_size check (size_bytes > 0 and size_bytes = octet_length(content)),
          constraint uploaded_files_sha256_hex check (sha256 ~ '^[0-9a-f]{64}$')
        );
        create unique index uploaded_files_screen_sha256_unique on uploaded_files (screen_id, sha256);

        create table plates (
          id uuid primary key default gen_random_uuid(),
          screen_id uuid not null references screens (id) on delete restrict,
          uploaded_file_id uuid not null references uploaded_files (id) on delete restrict,
          import_template_id uuid references import_templates (id) on delete set null,
          supersedes_plate_id uuid references plates (id) on delete restrict,
          label text not null,
          format smallint not null,
          state text not null default 'imported',
          version integer not null default 1,
          qc_summary jsonb not null default '[]',
          imported_by uuid not null references users (id),
          verified_by uuid references users (id),
          submitted_by uuid references users (id),
          decided_by uuid references users (id),
          imported_at timestamptz not null default now(),
          updated_at timestamptz not null default now(),
          constraint plates_format_known check (format in (96, 384, 1536)),
          constraint plates_state_known check (state in ('imported', 'verified', 'submitted', 'approved', 'rejected')),
          constraint plates_label_present check (length(trim(label)) > 0),
          constraint plates_version_positive check (version > 0),
          constraint plates_qc_summary_array check (jsonb_typeof(qc_summary) = 'array'),
          constraint plates_decider_independent check (
            decided_by is null or (decided_by <> imported_by and decided_by is distinct from verified_by)
          )
        );
        create index plates_screen_state on plates (screen_id, state, imported_at desc);
        create index plates_state_time on plates (state, imported_at desc);
        create index plates_imported_by on plates (imported_by);
        create unique index plates_uploaded_file_unique on plates (uploaded_file_id);

        create table wells (
          id uuid primary key default gen_random_uuid(),
          plate_id uuid not null references plates (id) on delete restrict,
          position text not null,
          row_index smallint not null,
          column_index smallint not null,
          role text not null,
          compound_id uuid references compounds (id) on delete restrict,
          batch_id uuid references batches (id) on delete restrict,
          concentration_um double precision,
          seal_resistance_gohm double precision,
          series_resistance_mohm double precision,
          capacitance_pf double precision,
          excluded boolean not null default false,
          exclusion_reason text,
          excluded_by uuid references users (id),
          excluded_at timestamptz,
          constraint wells_position_format check (position ~ '^[A-Z]{1,2}[0-9]{2}$'),
          constraint wells_row_column check (row_index >= 0 and row_index < 32 and column_index >= 0 and column_index < 48),
          constraint wells_role_known check (role in ('vehicle', 'reference', 'test')),
          constraint wells_test_has_compound check (role <> 'test' or (compound_id is not null and concentration_um > 0)),
          constraint wells_concentration_nonnegative check (concentration_um is null or concentration_um >= 0),
          constraint wells_exclusion_reason check (not excluded or length(trim(coalesce(exclusion_reason, ''))) > 0)
        );
        create unique index wells_plate_position_unique on wells (plate_id, position);
        create index wells_compound on wells (compound_id);

        create table readouts (
          id uuid primary key default gen_random_uuid(),
          well_id uuid not null references wells (id) on delete restrict,
          target_id uuid not null references targets (id) on delete restrict,
          control_current_pa double precision,
          compound_current_pa double precision,
          fractional_block double precision,
          qc_reasons jsonb not null default '[]',
          constraint readouts_qc_reasons_array check (jsonb_typeof(qc_reasons) = 'array')
        );
        create unique index readouts_well_target_unique on readouts (well_id, target_id);
        create index readouts_target on readouts (target_id);
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(
      'drop table if exists readouts, wells, plates, uploaded_files, import_templates cascade',
    );
  },
};
