'use strict';
// Screens (campaigns) with their QC thresholds, targets mapped to model conductances, compounds and batches.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        create table screens (
          id uuid primary key default gen_random_uuid(),
          name text not null,
          description text not null default '',
          neuron_preset text not null,
          zprime_min double precision not null default 0.5,
          seal_min_gohm double precision not null default 0.5,
          control_current_min_pa double precision not null default 200,
          series_max_mohm double precision not null default 25,
          capacitance_min_pf double precision not null default 1,
          capacitance_max_pf double precision not null default 100,
          rundown_max_fraction double precision not null default 0.2,
          normalise_to_reference boolean not null default false,
          exposures_um double precision[] not null default '{}',
          created_by uuid not null references users (id),
          created_at timestamptz not null default now(),
          updated_at timestamptz not null default now(),
          constraint screens_name_present check (length(trim(name)) > 0),
          constraint screens_zprime_range check (zprime_min <= 1),
          constraint screens_seal_positive check (seal_min_gohm >= 0),
          constraint screens_current_positive check (control_current_min_pa >= 0),
          constraint screens_series_positive check (series_max_mohm > 0),
          constraint screens_capacitance_range check (capacitance_min_pf >= 0 and capacitance_max_pf > capacitance_min_pf),
          constraint screens_rundown_range check (rundown_max_fraction >= 0 and rundown_max_fraction <= 1),
          constraint screens_exposures_positive check (0 < all (exposures_um))
        );
        create unique index screens_name_unique on screens (lower(name));

        create table targets (
          id uuid primary key default gen_random_uuid(),
          screen_id uuid not null references screens (id) on delete restrict,
          name text not null,
          conductance text not null,
          description text not null default '',
          created_at timestamptz not null default now(),
          updated_at timestamptz not null default now(),
          constraint targets_name_present check (length(trim(name)) > 0),
          constraint targets_conductance_name check (conductance ~ '^g[A-Za-z0-9]+$')
        );
        create unique index targets_screen_name_unique on targets (screen_id, lower(name));

        create table compounds (
          id uuid primary key default gen_random_uuid(),
          identifier text not null,
          name text not null default '',
          smiles text not null default '',
          molecular_weight double precision,
          created_by uuid not null references users (id),
          created_at timestamptz not null default now(),
          updated_at timestamptz not null default now(),
          constraint compounds_identifier_format check (identifier ~ '^[A-Za-z0-9][A-Za-z0-9_.-]*$'),
          constraint compounds_mw_positive check (molecular_weight is null or molecular_weight > 0)
        );
        create unique index compounds_identifier_unique on compounds (upper(identifier));

        create table batches (
          id uuid primary key default gen_random_uuid(),
          compound_id uuid not null references compounds (id) on delete restrict,
          lot text not null,
          purity_percent double precision,
          stock_concentration_mm double precision,
          solvent text not null default 'DMSO',
          created_by uuid not null references users (id),
          created_at timestamptz not null default now(),
          updated_at timestamptz not null default now(),
          constraint batches_lot_present check (length(trim(lot)) > 0),
          constraint batches_purity_range check (purity_percent is null or (purity_percent > 0 and purity_percent <= 100)),
          constraint batches_stock_positive check (stock_concentration_mm is null or stock_concentration_mm > 0)
        );
        create unique index batches_compound_lot_unique on batches (compound_id, lower(lot));
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query('drop table if exists batches, compounds, targets, screens cascade');
  },
};
