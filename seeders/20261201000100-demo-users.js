'use strict';
// Demo users for the invented scenario, one per role plus a second approver. The passwords are for the
// local demo only and are printed in the README; never use these accounts on a shared server.
const argon2 = require('argon2');

const DEMO_USERS = [
  { email: 'admin@gatewell.test', name: 'Ada Admin', roles: ['admin'], password: 'demo-admin-pass' },
  { email: 'chemist@gatewell.test', name: 'Chen Chemist', roles: ['chemist'], password: 'demo-chemist-pass' },
  {
    email: 'biologist@gatewell.test',
    name: 'Bea Biologist',
    roles: ['biologist'],
    password: 'demo-biologist-pass',
  },
  {
    email: 'approver@gatewell.test',
    name: 'Arun Approver',
    roles: ['approver'],
    password: 'demo-approver-pass',
  },
  {
    email: 'approver2@gatewell.test',
    name: 'Alma Approver',
    roles: ['approver'],
    password: 'demo-approver2-pass',
  },
];

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  DEMO_USERS,

  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      for (const user of DEMO_USERS) {
        const passwordHash = await argon2.hash(user.password, { type: argon2.argon2id });
        const [rows] = await queryInterface.sequelize.query(
          `insert into users (email, name, password_hash) values (:email, :name, :passwordHash)
           on conflict (email) do update set name = excluded.name returning id`,
          { replacements: { email: user.email, name: user.name, passwordHash }, transaction },
        );
        const userId = rows[0].id;
        for (const role of user.roles) {
          await queryInterface.sequelize.query(
            'insert into user_roles (user_id, role) values (:userId, :role) on conflict do nothing',
            { replacements: { userId, role }, transaction },
          );
        }
        await queryInterface.sequelize.query(
          `insert into audit_events (actor_id, action, entity_type, entity_id, after, reason)
           values (null, 'create', 'user', :userId, :after, 'demo data seeded')`,
          {
            replacements: {
              userId,
              after: JSON.stringify({ email: user.email, name: user.name, roles: user.roles }),
            },
            transaction,
          },
        );
      }
    });
  },

  async down() {
    // Users are referenced by an append-only audit trail; demo users are removed by resetting the database.
  },
};
