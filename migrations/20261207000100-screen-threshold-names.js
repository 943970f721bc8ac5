'use strict';
// One spelling for each QC quantity (lib/domain/readouts.ts): the screens' threshold columns take the
// words the app uses for them, snake_cased (sealResistanceMin_GOhm is seal_resistance_min_gohm). Only names
// change; values, defaults and CHECK constraints (PostgreSQL renames the columns inside them) stay. Audit
// events written before keep the attribute names of their day: the audit trail is append-only.

const RENAMES = [
  ['zprime_min', 'z_prime_min'],
  ['seal_min_gohm', 'seal_resistance_min_gohm'],
  ['series_max_mohm', 'series_resistance_max_mohm'],
  ['rundown_max_fraction', 'vehicle_rundown_max_fraction'],
];

function renameColumns(pairs) {
  return pairs.map(([from, to]) => `alter table screens rename column ${from} to ${to};`).join('\n');
}

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(renameColumns(RENAMES), { transaction });
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(renameColumns(RENAMES.map(([from, to]) => [to, from])), {
        transaction,
      });
    });
  },
};
