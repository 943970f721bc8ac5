'use strict';
// Block read at more than one moment (issue 20 point 2): a target may report a tonic readout (first pulse,
// resting holding potential) and a use-dependent one (n-th pulse of a train, depolarised holding
// potential). targets.block_readouts names them as the screen calls them ({} keeps one readout, the tonic
// one); readouts and fits carry which readout they are, part of each one's unique key. Existing rows are
// the tonic readout, so every plate, fit and signature stays as it was.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        alter table targets
          add column block_readouts jsonb not null default '{}',
          add constraint targets_block_readouts_object check (jsonb_typeof(block_readouts) = 'object');
        alter table readouts
          add column readout text not null default 'tonic',
          add constraint readouts_readout_known check (readout in ('tonic', 'use_dependent'));
        drop index readouts_well_target_unique;
        create unique index readouts_well_target_unique
          on readouts (well_id, target_id, readout, coalesce(concentration_um, -1));
        alter table fits
          add column readout text not null default 'tonic',
          add constraint fits_readout_known check (readout in ('tonic', 'use_dependent'));
        drop index fits_plate_compound_target_unique;
        create unique index fits_plate_compound_target_unique on fits (plate_id, compound_id, target_id, readout);
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      // One readout per target again: refused while a plate with a use-dependent readout is stored.
      await queryInterface.sequelize.query(
        `
        do $$
        begin
          if exists (select 1 from readouts where readout <> 'tonic') then
            raise exception 'use-dependent readouts are stored; delete those plates first';
          end if;
        end $$;
        delete from fits where readout <> 'tonic';
        drop index fits_plate_compound_target_unique;
        create unique index fits_plate_compound_target_unique on fits (plate_id, compound_id, target_id);
        alter table fits drop constraint fits_readout_known, drop column readout;
        drop index readouts_well_target_unique;
        create unique index readouts_well_target_unique
          on readouts (well_id, target_id, coalesce(concentration_um, -1));
        alter table readouts drop constraint readouts_readout_known, drop column readout;
        alter table targets drop constraint targets_block_readouts_object, drop column block_readouts;
        `,
        { transaction },
      );
    });
  },
};
