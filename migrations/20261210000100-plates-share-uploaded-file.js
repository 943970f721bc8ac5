'use strict';
// Several plates in one file (issue 18): an export may hold a plate per sheet or a plate column, and each
// plate is stored as a plate of its own. The plates of one file share its uploaded_files row (still one
// per screen and SHA-256, so a file imported twice is refused as before): the unique index on
// plates.uploaded_file_id becomes a plain one. An import draft and an import job that stored several
// plates keep them all in plate_ids (plate_id stays the first, for readers of one plate).
// Down refuses while any file holds more than one plate (the unique index cannot come back then).

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        drop index plates_uploaded_file_unique;
        create index plates_uploaded_file on plates (uploaded_file_id);
        alter table import_drafts add column plate_ids uuid[];
        alter table compute_jobs add column plate_ids uuid[];
        alter table compute_jobs add constraint compute_jobs_plate_ids_first
          check (plate_ids is null or (cardinality(plate_ids) >= 1 and plate_ids[1] = plate_id));
        alter table import_drafts add constraint import_drafts_plate_ids_first
          check (plate_ids is null or (cardinality(plate_ids) >= 1 and plate_ids[1] = plate_id));
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        alter table import_drafts drop constraint if exists import_drafts_plate_ids_first;
        alter table compute_jobs drop constraint if exists compute_jobs_plate_ids_first;
        alter table compute_jobs drop column if exists plate_ids;
        alter table import_drafts drop column if exists plate_ids;
        drop index if exists plates_uploaded_file;
        create unique index plates_uploaded_file_unique on plates (uploaded_file_id);
        `,
        { transaction },
      );
    });
  },
};
