'use strict';
// A password that an administrator set (a new account's first one, or a reset) is for one sign-in only:
// until its owner chooses their own, Gatewell lets them do nothing else.

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(
      'alter table users add column password_change_required boolean not null default false',
    );
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query('alter table users drop column if exists password_change_required');
  },
};
