'use strict';
// A message a sender has claimed carries the end of its claim, so that an administrator bringing the
// waiting messages forward ("Send waiting mail now") leaves alone the ones being sent at that moment.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query('alter table mail_outbox add column claimed_until timestamptz');
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query('alter table mail_outbox drop column if exists claimed_until');
  },
};
