'use strict';
// Readouts of exports that give the block directly and of cumulative application (issue 18):
// block_given marks a readout whose file gave the fractional block itself instead of the current after
// compound, and given_block holds it (null when the file left it empty); concentration_um is the
// concentration of one application when a cell received several in turn (null: the well's concentration),
// so one well may carry one readout per target and concentration.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        alter table readouts
          add column block_given boolean not null default false,
          add column given_block double precision,
          add column concentration_um double precision,
          add constraint readouts_given_block_only_given check (block_given or given_block is null),
          add constraint readouts_concentration_positive check (concentration_um is null or concentration_um > 0);
        drop index readouts_well_target_unique;
        create unique index readouts_well_target_unique
          on readouts (well_id, target_id, coalesce(concentration_um, -1));
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      // One readout per well and target again: refused while a plate of cumulative application is stored.
      await queryInterface.sequelize.query(
        `
        do $$
        begin
          if exists (select 1 from readouts where concentration_um is not null) then
            raise exception 'readouts of cumulative application are stored; delete those plates first';
          end if;
        end $$;
        drop index readouts_well_target_unique;
        create unique index readouts_well_target_unique on readouts (well_id, target_id);
        alter table readouts
          drop constraint readouts_concentration_positive,
          drop constraint readouts_given_block_only_given,
          drop column concentration_um,
          drop column given_block,
          drop column block_given;
        `,
        { transaction },
      );
    });
  },
};
