'use strict';
// Indexes for the plates list (lib/plates/list.ts): its pages in import order, and the readouts that
// fail QC, which make a well count as failing. Few readouts fail, so the partial index stays small.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(`
      create index plates_imported_at on plates (imported_at desc, id desc);
      create index readouts_failing_well on readouts (well_id) where jsonb_array_length(qc_reasons) > 0;
    `);
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`
      drop index if exists readouts_failing_well;
      drop index if exists plates_imported_at;
    `);
  },
};
