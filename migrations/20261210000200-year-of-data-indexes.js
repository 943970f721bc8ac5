'use strict';
// Indexes for reads that a year of data (5,000 plates, docs/performance.md, "A year of data") showed slow:
//
// - audit_events_newest (occurred_at desc, id desc) serves the audit trail's pages newest first
//   (lib/audit/queries.ts, selectAuditEvents: order by occurred_at desc, id desc, limit and offset), whole,
//   so PostgreSQL reads the page's rows in order instead of sorting each group of equal times by id. It
//   also serves the time-range filter (from/to), so it replaces audit_events_time (occurred_at desc), its prefix.
// - wells_compound_plate (compound_id, plate_id) lets the compound registry count each compound's plates
//   (lib/compounds/queries.ts, selectCompoundSummaries: count(distinct plate_id) where compound_id = …) from
//   the index alone, instead of a heap visit per well; it replaces wells_compound (compound_id), its prefix,
//   which the foreign key's checks and a compound's wells use as well.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        create index audit_events_newest on audit_events (occurred_at desc, id desc);
        drop index audit_events_time;
        create index wells_compound_plate on wells (compound_id, plate_id);
        drop index wells_compound;
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        create index if not exists wells_compound on wells (compound_id);
        drop index if exists wells_compound_plate;
        create index if not exists audit_events_time on audit_events (occurred_at desc);
        drop index if exists audit_events_newest;
        `,
        { transaction },
      );
    });
  },
};
